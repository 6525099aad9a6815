using System.CommandLine;
using Meanfield.Analysis;
using Meanfield.Output;
using Meanfield.Solutions;
using Meanfield.Solver;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield solve MODEL --out solution.json`: the saddle point, its summary and digest, and the JSON solution file.</summary>
public static class SolveCommand
{
    public static Command Build()
    {
        var model = CommonOptions.ModelArgument();
        var set = CommonOptions.Set();
        var temperature = CommonOptions.Temperature();
        var mesh = CommonOptions.Mesh();
        var output = CommonOptions.Out();
        var (tolerance, iterations) = (CommonOptions.Tolerance(), CommonOptions.MaxIterations());
        var command = new Command("solve", "Solve the auxiliary-boson saddle point and write the solution as JSON") { model, set, temperature, mesh, tolerance, iterations, output };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var path = parse.GetValue(output)!;
            OutputGuard.Check(path, [parse.GetValue(model)]);
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, CommonOptions.ParseSets(parse.GetValue(set)));
            if (bound.Shells.Count == 0) throw new UserInputException(SolutionInput.NothingToSolve(bound, SolutionInput.Recognise(bound.SourcePath) == InputKind.ExportedModel ? Output.OneBodyModelFiles.Load(bound.SourcePath).Header : null));
            var settings = CommonOptions.Settings(bound, parse.GetValue(temperature), parse.GetValue(mesh), "--temperature", parse.GetValue(tolerance), parse.GetValue(iterations));
            var sp = new SaddlePointSolver(bound, settings).Solve();
            if (!sp.Converged)
            {
                o.WriteLine(Summary.Solution(sp, bound, null, null));
                parse.InvocationConfiguration.Error.WriteLine($"error: not converged; {OutputGuard.NotWrittenNote(path)}");
                return ExitCodes.NotConverged;
            }
            var clock = System.Diagnostics.Stopwatch.StartNew();
            var solution = Solution.FromSaddlePoint(bound, sp, settings);
            var digest = SpectrumSummary.Compute(solution);
            o.WriteLine(Summary.Solution(sp, bound, solution, digest));
            if (digest.Phase is { } phase) o.WriteLine($"phase        {phase.Name} ({phase.Reason}; {clock.Elapsed.TotalSeconds:F2} s)");
            SolutionDocument.From(solution, digest).Save(path);
            o.WriteLine($"wrote {path}");
            return ExitCodes.Success;
        });
        return command;
    }
}
