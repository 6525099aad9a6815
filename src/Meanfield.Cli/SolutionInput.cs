using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Output;
using Meanfield.Renormalization;
using Meanfield.Solver;

namespace Meanfield.Cli;

/// <summary>
/// What the analysis commands work on: a model with its saddle point, from a solution file or solved on the fly, or the
/// bare model when asked (--bare).
/// </summary>
public sealed record SolutionInput(BoundModel Model, IBlochSource Hamiltonian, double? Mu, SaddlePoint? Solution, string Origin)
{
    public static SolutionInput Resolve(string input, string[]? sets, string? temperature, int? mesh, bool bare, TextWriter log)
    {
        if (input.EndsWith(".json", StringComparison.OrdinalIgnoreCase))
        {
            if (!File.Exists(input)) throw new UserInputException($"{input}: solution file not found");
            var doc = SolutionDocument.Load(input);
            if (!doc.Converged) throw new UserInputException($"{input}: the solution did not converge; it cannot be used");
            var model = doc.BindModel(input, CommonOptions.ParseSets(sets));
            var amp = doc.AmplitudesFor(model, input);
            return new(model, new RenormalizedHamiltonian(new BlochHamiltonian(model), amp), doc.Mu, null, input);
        }
        var m = CommonOptions.LoadModel(input, CommonOptions.ParseSets(sets));
        if (bare || m.Shells.Count == 0)
            return new(m, new BlochHamiltonian(m), null, null, "bare model");
        var settings = CommonOptions.Settings(m, temperature, mesh);
        var sp = new SaddlePointSolver(m, settings).Solve();
        log.WriteLine(Summary.SolutionLine(sp, m));
        if (!sp.Converged)
            throw new NotConvergedException(sp);
        return new(m, new RenormalizedHamiltonian(new BlochHamiltonian(m), sp.Amplitudes), sp.Mu, sp, "solved on the fly");
    }
}

/// <summary>The saddle point did not converge; carries the attempt for the message.</summary>
public sealed class NotConvergedException(SaddlePoint attempt)
    : Exception($"the saddle point did not converge after {attempt.Iterations} iterations (residual {attempt.ResidualNorm:G3}). {string.Join(" ", attempt.Notes)}")
{
    public SaddlePoint Attempt { get; } = attempt;
}
