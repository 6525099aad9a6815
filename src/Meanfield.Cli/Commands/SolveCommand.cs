using System.CommandLine;
using Meanfield.Output;
using Meanfield.Solver;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield solve MODEL --out solution.json`: the saddle point, its summary, and the JSON solution file.</summary>
public static class SolveCommand
{
    public static Command Build()
    {
        var model = CommonOptions.ModelArgument();
        var set = CommonOptions.Set();
        var temperature = CommonOptions.Temperature();
        var mesh = CommonOptions.Mesh();
        var output = CommonOptions.Out();
        var command = new Command("solve", "Solve the auxiliary-boson saddle point and write the solution as JSON") { model, set, temperature, mesh, output };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var path = parse.GetValue(output)!;
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, CommonOptions.ParseSets(parse.GetValue(set)));
            var settings = CommonOptions.Settings(bound, parse.GetValue(temperature), parse.GetValue(mesh));
            var sp = new SaddlePointSolver(bound, settings).Solve();
            o.WriteLine(Summary.Solution(sp, bound));
            if (!sp.Converged)
            {
                parse.InvocationConfiguration.Error.WriteLine($"error: not converged; {path} was not written");
                return ExitCodes.NotConverged;
            }
            SolutionDocument.From(sp, bound, settings).Save(path);
            o.WriteLine($"wrote {path}");
            return ExitCodes.Success;
        });
        return command;
    }
}
