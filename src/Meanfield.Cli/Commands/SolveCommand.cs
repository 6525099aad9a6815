using System.CommandLine;
using Meanfield.Analysis;
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
            OutputGuard.Check(path, [parse.GetValue(model)]);
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, CommonOptions.ParseSets(parse.GetValue(set)));
            var settings = CommonOptions.Settings(bound, parse.GetValue(temperature), parse.GetValue(mesh));
            var sp = new SaddlePointSolver(bound, settings).Solve();
            o.WriteLine(Summary.Solution(sp, bound));
            if (!sp.Converged)
            {
                parse.InvocationConfiguration.Error.WriteLine($"error: not converged; {OutputGuard.NotWrittenNote(path)}");
                return ExitCodes.NotConverged;
            }
            var doc = SolutionDocument.From(sp, bound, settings);
            if (!bound.IsMomentumFree)
            {
                var clock = System.Diagnostics.Stopwatch.StartNew();
                var digest = Spectrum(sp, bound, settings);
                o.WriteLine($"phase        {digest.PhaseName} ({digest.PhaseReason}; {clock.Elapsed.TotalSeconds:F2} s)");
                doc = doc with
                {
                    Phase = digest.PhaseName, PhaseReason = digest.PhaseReason, DirectGap = Finite(digest.DirectGap),
                    IndirectGap = Finite(digest.IndirectGap), DosFermiTotal = Finite(digest.DosFermiTotal),
                    DosFermiCorrelated = Finite(digest.DosFermiCorrelated),
                };
            }
            doc.Save(path);
            o.WriteLine($"wrote {path}");
            return ExitCodes.Success;
        });
        return command;
    }

    private static SpectrumDigest Spectrum(SaddlePoint sp, Binding.BoundModel model, SolverSettings settings)
    {
        var mesh = new Lattices.KMesh(model.Lattice, settings.Mesh, settings.Shifted);
        var renormalized = new Renormalization.RenormalizedHamiltonian(new Bloch.BlochHamiltonian(model), sp.Amplitudes);
        return SpectrumSummary.Compute(renormalized, model, sp.Mu, sp.Branch == SaddlePointBranch.Decoupled, mesh,
                                       energyTolerance: sp.Temperature);
    }

    private static double? Finite(double v) => double.IsFinite(v) ? v : null;
}
