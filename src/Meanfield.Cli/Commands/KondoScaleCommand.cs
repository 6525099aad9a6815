using System.CommandLine;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield kondo-scale MODEL`: the mean-field Kondo temperature by continuation and bisection in T.</summary>
public static class KondoScaleCommand
{
    public static Command Build()
    {
        var model = CommonOptions.ModelArgument();
        var set = CommonOptions.Set();
        var mesh = CommonOptions.Mesh();
        var start = new Option<string?>("--from") { Description = "Starting (low) temperature, e.g. 0.5K (default: the model's [solver] temperature, else 1e-3 of the energy unit)" };
        var tolerance = new Option<double>("--relative-tolerance") { Description = "Bisection stops at this relative width", DefaultValueFactory = _ => 1e-5 };
        var command = new Command("kondo-scale", "Find the mean-field Kondo temperature T_K^MF (where r -> 0)") { model, set, mesh, start, tolerance };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, CommonOptions.ParseSets(parse.GetValue(set)));
            var baseSettings = CommonOptions.Settings(bound, parse.GetValue(start), parse.GetValue(mesh), "--from");
            double t0 = baseSettings.Temperature > 0 ? baseSettings.Temperature : 1e-3;
            var result = KondoTemperature.FindFromStability(
                t => new SaddlePointSolver(bound, baseSettings with { Temperature = t }).DecoupledStability()?.Min() ?? double.NaN,
                t0, parse.GetValue(tolerance), progress: new SyncProgress(o));
            if (result.Temperature is not { } tk)
            {
                parse.InvocationConfiguration.Error.WriteLine($"error: {result.Problem}");
                return ExitCodes.NoAnswer;
            }
            o.WriteLine($"T_K^MF = {tk:G6} {bound.Unit.Symbol()} = {tk * bound.Unit.Kelvins():G6} K  (where the decoupled solution turns unstable; a sharp transition only at mean field, a crossover in reality)");
            return ExitCodes.Success;
        });
        return command;
    }

    private sealed class SyncProgress(TextWriter o) : IProgress<string>
    {
        public void Report(string value) => o.WriteLine("  " + value);
    }
}
