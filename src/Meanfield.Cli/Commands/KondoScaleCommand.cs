using System.CommandLine;
using System.Globalization;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield kondo-scale MODEL`: the mean-field Kondo temperature, checked on a finer mesh (<see cref="KondoScaleStudy"/>).</summary>
public static class KondoScaleCommand
{
    public static Command Build()
    {
        var model = CommonOptions.ModelArgument();
        var set = CommonOptions.Set();
        var mesh = CommonOptions.Mesh();
        var start = new Option<string?>("--from") { Description = "Starting (low) temperature, e.g. 0.5K (default: the model's [solver] temperature, else 1e-3 of the energy unit)" };
        var tolerance = new Option<double>("--relative-tolerance") { Description = "Bisection stops at this relative width", DefaultValueFactory = _ => 1e-5 };
        var command = new Command("kondo-scale", "Find the mean-field Kondo temperature T_K^MF (where the decoupled solution turns unstable), checked on a finer mesh") { model, set, mesh, start, tolerance };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, CommonOptions.ParseSets(parse.GetValue(set)));
            var settings = CommonOptions.Settings(bound, parse.GetValue(start), parse.GetValue(mesh), "--from");
            if (!(parse.GetValue(tolerance) is > 0 and < 1)) throw new UserInputException($"--relative-tolerance {parse.GetValue(tolerance)}: use a number in (0, 1)");
            var report = KondoScaleStudy.Run(bound, settings, parse.GetValue(tolerance), new LineProgress(o));
            if (report.Result.Temperature is not { } tk)
            {
                parse.InvocationConfiguration.Error.WriteLine($"error: {report.Result.Problem}");
                return ExitCodes.NoAnswer;
            }
            var (u, kelvin, inv) = (bound.Unit.Symbol(), bound.Unit.Kelvins(), CultureInfo.InvariantCulture);
            o.WriteLine(string.Create(inv, $"T_K^MF = {tk:G6} {u} = {tk * kelvin:G6} K{(report.Mesh is { } m ? $" on mesh {m}" : "")}  (where the decoupled solution turns unstable; a sharp transition only at mean field, a crossover in reality)"));
            if (report.CheckMesh is { } cm)
                o.WriteLine(report.Check?.Temperature is { } tc
                    ? string.Create(inv, $"check on mesh {cm}: {tc * kelvin:G6} K, {100 * report.RelativeChange:F1} % away{(report.MeshConverged ? "" : $": NOT mesh-converged (more than {100 * KondoScaleStudy.MeshAgreement:G2} %); rerun with a larger --mesh")}")
                    : $"check on mesh {cm} found no T_K^MF ({report.Check?.Problem}): NOT mesh-converged; rerun with a larger --mesh");
            return report.MeshConverged ? ExitCodes.Success : ExitCodes.NotConverged;
        });
        return command;
    }

    private sealed class LineProgress(TextWriter o) : IProgress<string>
    {
        public void Report(string value) => o.WriteLine("  " + value);
    }
}
