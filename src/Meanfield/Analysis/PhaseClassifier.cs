using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;

namespace Meanfield.Analysis;

/// <summary>
/// Labels a solution. Rules, applied in order (energies in the model's unit, tolerances in <see cref="Tolerances"/>):
/// 1. all boson amplitudes r = 0 -> Decoupled;
/// 2. indirect gap &gt; GapTolerance on the mesh and no band touching found by the node search -> KondoInsulator
///    (common practice: a Kondo insulator is a band insulator of the renormalized bands; a coarse mesh can miss a
///    node and report a positive gap, so found nodes take precedence);
/// 3. the node search reports a metal (bands n_occ - 1 and n_occ overlap, or mu cuts a band), or the DOS at the
///    Fermi level exceeds DosTolerance while no node sits at mu -> HeavyMetal;
/// 4. a nodal line at mu -> NodalLine;
/// 5. nodes with |E - mu| &lt; EnergyTolerance: any of nonzero chirality -> WeylSemimetal; otherwise fourfold ones
///    -> DiracSemimetal;
/// 6. anything else (touchings away from mu, no node data) -> HeavyMetal.
/// </summary>
public static class PhaseClassifier
{
    public sealed record Tolerances(double GapTolerance = 1e-6, double EnergyTolerance = 1e-6, double DosTolerance = 1e-3);

    public static PhaseLabel Classify(bool decoupled, GapReport gap, NodeSearchResult? nodes, double dosAtFermi, Tolerances? tol = null)
    {
        var t = tol ?? new Tolerances();
        if (decoupled) return new(Phase.Decoupled, "all boson amplitudes vanish (r = 0)");
        if (gap.Indirect > t.GapTolerance && (nodes is null || nodes.Nodes.Count == 0))
            return new(Phase.KondoInsulator, $"indirect gap {gap.Indirect:G4} > {t.GapTolerance:G3}");
        var atMu = nodes?.Nodes.Where(n => Math.Abs(n.EnergyOffset) < t.EnergyTolerance).ToList() ?? [];
        if (nodes is { IsMetal: true })
            return new(Phase.HeavyMetal, $"bands overlap by {nodes.BandOverlap:G4} or the chemical potential cuts a band");
        if (atMu.Count == 0 && dosAtFermi > t.DosTolerance)
            return new(Phase.HeavyMetal, $"DOS at the Fermi level {dosAtFermi:G4} and no node at mu");
        if (nodes is { NodalLineSuspected: true } && atMu.Count > 0)
            return new(Phase.NodalLine, $"{atMu.Count} touching points at mu form a line");
        if (atMu.Any(n => n.Chirality != 0))
            return new(Phase.WeylSemimetal, $"{atMu.Count(n => n.Chirality != 0)} Weyl nodes at mu, chiralities sum to {nodes!.ChiralitySum}");
        if (atMu.Any(n => n.Degeneracy >= 4))
            return new(Phase.DiracSemimetal, $"{atMu.Count(n => n.Degeneracy >= 4)} fourfold nodes at mu with zero chirality");
        return new(Phase.HeavyMetal, nodes is null ? "no gap and no node data" : "no gap and no node pinned at mu");
    }
}
