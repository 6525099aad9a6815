using System.Text;
using Meanfield.Binding;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Cli;

/// <summary>Human-readable console summaries of library results.</summary>
public static class Summary
{
    public static string SolutionLine(SaddlePoint sp, BoundModel model)
    {
        var u = model.Unit.Symbol();
        var groups = string.Join(", ", sp.Groups.Select(g => $"{g.Name}: r={g.R:G5} z={g.Z:G4}"));
        return $"{(sp.Converged ? "converged" : "NOT converged")} ({sp.Branch.ToString().ToLowerInvariant()}) in {sp.Iterations} iterations: mu = {sp.Mu:G8} {u}; {groups}";
    }

    /// <summary>The solve summary; with the handle, mu is the placed one and its rule is named.</summary>
    public static string Solution(SaddlePoint sp, BoundModel model, Solutions.Solution? solution, Analysis.SpectrumDigest? digest)
    {
        var u = model.Unit.Symbol();
        double kelvin = model.Unit.Kelvins();
        var sb = new StringBuilder();
        sb.AppendLine($"model        {model.Name}  ({model.SourcePath})");
        sb.AppendLine($"status       {(sp.Converged ? "converged" : "NOT CONVERGED")} after {sp.Iterations} iterations, residual {sp.ResidualNorm:G3}, {sp.ZonePasses} zone passes, {sp.WallSeconds:F2} s");
        sb.AppendLine($"branch       {(sp.Branch == SaddlePointBranch.Kondo ? "Kondo (r > 0: coherent heavy quasiparticles)" : "decoupled (r = 0: local moments)")}");
        sb.AppendLine($"temperature  {sp.Temperature:G6} {u} = {sp.Temperature * kelvin:G6} K");
        sb.AppendLine($"sampling     {sp.Sampling}");
        if (sp.Symmetry is { } sym) sb.AppendLine($"symmetry     {sym}");
        double mu = solution?.Mu ?? sp.Mu;
        sb.AppendLine($"mu           {mu:G10} {u}" + (solution is null ? "" : $"  ({Output.SolutionDocument.RuleName(solution.MuRule)})"));
        sb.AppendLine($"free energy  {sp.FreeEnergy:G10} {u} per cell" + (sp.DecoupledFreeEnergy is { } fd && sp.Branch == SaddlePointBranch.Kondo ? $"  (decoupled: {fd:G10})" : ""));
        sb.AppendLine($"electrons    {sp.ElectronsPerCell:G6} per cell");
        sb.AppendLine($"{"group",-8} {"r",12} {"z = r^2",12} {"lambda",14} {"eps_f+lambda-mu",16} {"n_f",10}");
        foreach (var g in sp.Groups)
            sb.AppendLine($"{g.Name,-8} {g.R,12:G6} {g.Z,12:G6} {g.Lambda,14:G8} {g.BareLevel + g.Lambda - mu,16:G6} {g.FOccupation,10:G6}");
        if (sp.Groups.Any(g => g.Bosons is not null))
        {
            sb.AppendLine($"{"finite U",-8} {"U",12} {"e",12} {"p",14} {"d",16} {"d^2",10}   (four bosons, r = p(e+d)/sqrt(n/2 (1-n/2)))");
            foreach (var g in sp.Groups)
                if (g.Bosons is { } b) sb.AppendLine($"{g.Name,-8} {g.U,12:G6} {b.E,12:G6} {b.P,14:G6} {b.D,16:G6} {b.D * b.D,10:G6}");
        }
        if (digest?.Nodes is { } nodes && nodes.Nodes.Count > 0)
            sb.AppendLine($"nodes        {nodes.Nodes.Count} ({nodes.Nodes.Count(n => n.Pinning == Analysis.Nodes.NodePinning.Pinned)} pinned at mu), largest |E - mu| {nodes.Nodes.Max(n => Math.Abs(n.EnergyOffset)):G4} {u}");
        foreach (var n in sp.Notes) sb.AppendLine($"note: {n}");
        return sb.ToString().TrimEnd();
    }
}
