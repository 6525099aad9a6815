using System.Globalization;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;

namespace Meanfield.Analysis;

/// <summary>
/// Labels a solution: the one phase rule of meanfield. Energies in the model's unit; every tolerance comes from the
/// node search's <see cref="SpectrumTolerances"/> (relative to the width of the bands next to the electron count and to
/// k_B T). Rules, in order:
/// 1. all boson amplitudes r = 0 -> Decoupled;
/// 2. a partly filled band (non-integer electron count) -> HeavyMetal (a Fermi surface by the Luttinger count);
/// 3. a nodal line -> NodalLine;
/// 4. bands n_occ - 1 and n_occ overlapping beyond what the node energies explain -> HeavyMetal;
/// 5. chiralities undetermined, not summing to zero (Nielsen &amp; Ninomiya, Nucl. Phys. B 185, 20 (1981)), or a gap
///    minimum that would not refine -> Unresolved, with the advice to refine: never a topological label on an
///    unresolved search;
/// 6. no node: indirect gap above the gap tolerance -> KondoInsulator (common practice: a band insulator of the
///    renormalized bands); otherwise Unresolved (the bands touch on the mesh but no touching refined);
/// 7. nodes: all pinned at mu -> WeylSemimetal when some chirality is nonzero, else DiracSemimetal; some off mu ->
///    the same with pockets.
/// A Kondo insulator is then given its topological class by <see cref="WithTopology"/>.
/// </summary>
public static class PhaseClassifier
{
    /// <summary>The label of a solution from its branch, electron count, gaps and node search.</summary>
    /// <param name="decoupled">True on the r = 0 branch.</param>
    /// <param name="wholeFilling">The electron count fills a whole number of bands (otherwise a metal).</param>
    /// <param name="gap">Gaps between bands n_occ - 1 and n_occ; null for a partly filled band.</param>
    /// <param name="nodes">The node search; null for a partly filled band.</param>
    /// <exception cref="ArgumentException">A whole filling without gap or node data.</exception>
    public static PhaseLabel Classify(bool decoupled, bool wholeFilling, GapReport? gap, NodeSearchResult? nodes)
    {
        var inv = CultureInfo.InvariantCulture;
        if (decoupled) return new(Phase.Decoupled, "all boson amplitudes vanish (r = 0)");
        if (!wholeFilling) return new(Phase.HeavyMetal, "the electron count fills a band partly: a Fermi surface (Luttinger count)");
        if (gap is null || nodes is null) throw new ArgumentException("a whole filling needs the gap report and the node search");
        var t = nodes.Tolerances;
        if (nodes.NodalLineSuspected) return new(Phase.NodalLine, $"{nodes.Nodes.Count} touching points form a line or a flat cone");
        if (nodes.FermiSurfaceAwayFromNodes)
            return new(Phase.HeavyMetal, string.Create(inv, $"bands {nodes.OccupiedBands - 1} and {nodes.OccupiedBands} overlap by {nodes.BandOverlap:G4}: a Fermi surface away from the nodes"));
        if (!nodes.ChiralitiesResolved)
            return new(Phase.Unresolved, $"the chirality of {nodes.Nodes.Count(n => n.Chirality is null)} node(s) is undetermined; refine the node search (a finer search mesh)");
        if (nodes.ChiralitySum is { } sum && sum != 0)
            return new(Phase.Unresolved, $"chiralities sum to {sum}, not zero: nodes were missed; refine the node search (a finer search mesh)");
        if (nodes.UnresolvedMinima > 0)
            return new(Phase.Unresolved, $"{nodes.UnresolvedMinima} gap minima below {string.Create(inv, $"{t.Gap:G3}")} did not refine to a touching; refine the node search");
        if (nodes.Nodes.Count == 0)
            return gap.Indirect > t.Gap
                ? new(Phase.KondoInsulator, string.Create(inv, $"indirect gap {gap.Indirect:G4} (> {t.Gap:G3}) and no band touching"))
                : new(Phase.Unresolved, string.Create(inv, $"indirect gap {gap.Indirect:G4} within the tolerance {t.Gap:G3} but no touching refined; refine the node search"));
        int weyl = nodes.Nodes.Count(n => n.Chirality is { } c && c != 0);
        int pinned = nodes.Nodes.Count(n => n.Pinning == NodePinning.Pinned);
        string kind = weyl > 0 ? "Weyl" : "Dirac";
        string sumText = nodes.ChiralitySum is { } s ? $", chiralities sum to {s}" : "";
        if (pinned == nodes.Nodes.Count)
            return new(weyl > 0 ? Phase.WeylSemimetal : Phase.DiracSemimetal,
                       string.Create(inv, $"{nodes.Nodes.Count} {kind} nodes pinned at mu (within {t.Pinning:G3}){sumText}"));
        double worst = nodes.Nodes.Max(n => Math.Abs(n.EnergyOffset));
        return new(weyl > 0 ? Phase.WeylSemimetalWithPockets : Phase.DiracSemimetalWithPockets,
                   string.Create(inv, $"{nodes.Nodes.Count - pinned} of {nodes.Nodes.Count} {kind} nodes off mu (up to {worst:G4}): pockets around them{sumText}"));
    }

    /// <summary>
    /// The class of a Kondo insulator from its invariants: 3D with time reversal, Z2 (nu0; nu1 nu2 nu3) -> trivial,
    /// weak or strong (Fu, Kane &amp; Mele, PRL 98, 106803 (2007); for the heavy bands Dzero, Sun, Galitski &amp;
    /// Coleman, PRL 104, 106408 (2010)); 2D: Z2 with time reversal, the Chern number without (Fukui, Hatsugai &amp;
    /// Suzuki, J. Phys. Soc. Jpn. 74, 1674 (2005)) -> trivial or topological. An invariant that is not determined keeps
    /// the plain <see cref="Phase.KondoInsulator"/> label, and the reason says why: never a class the calculation did
    /// not settle. Any other label is returned unchanged.
    /// </summary>
    /// <param name="label">The label from <see cref="Classify"/>.</param>
    /// <param name="invariants">The invariants of the filled bands; null when they were not computed.</param>
    public static PhaseLabel WithTopology(PhaseLabel label, Topology.InvariantReport? invariants)
    {
        if (label.Phase != Phase.KondoInsulator || invariants is null) return label;
        var z2 = invariants.Z2;
        if (invariants.Chern is { } chern)
        {
            if (chern.Status != Topology.InvariantStatus.Determined || chern.Chern is not { } c)
                return label with { Reason = $"{label.Reason}; Chern number not determined ({chern.Reason})" };
            return c == 0
                ? new(Phase.TrivialKondoInsulator, $"{label.Reason}; Chern number 0")
                : new(Phase.TopologicalKondoInsulator, $"{label.Reason}; Chern number {c}");
        }
        if (z2.Status != Topology.InvariantStatus.Determined || z2.Indices is not { } x)
            return label with { Reason = $"{label.Reason}; topological class not determined: {z2.Reason}" };
        var phase = x.Class switch
        {
            Topology.Z2Class.Trivial => Phase.TrivialKondoInsulator,
            Topology.Z2Class.Weak => Phase.WeakTopologicalKondoInsulator,
            _ => x.Dimension == 2 ? Phase.TopologicalKondoInsulator : Phase.StrongTopologicalKondoInsulator,
        };
        return new(phase, $"{label.Reason}; Z2 {x} ({z2.Reason})");
    }

    /// <summary>A phase in words for pictures and reports ("strong topological Kondo insulator"), one for every <see cref="Phase"/>.</summary>
    /// <exception cref="ArgumentOutOfRangeException">A value outside the enum.</exception>
    public static string Readable(Phase phase) => phase switch
    {
        Phase.Decoupled => "decoupled local moments",
        Phase.KondoInsulator => "Kondo insulator (class not settled)",
        Phase.TrivialKondoInsulator => "trivial Kondo insulator",
        Phase.WeakTopologicalKondoInsulator => "weak topological Kondo insulator",
        Phase.StrongTopologicalKondoInsulator => "strong topological Kondo insulator",
        Phase.TopologicalKondoInsulator => "topological Kondo insulator (2D)",
        Phase.WeylSemimetal => "Weyl semimetal",
        Phase.DiracSemimetal => "Dirac semimetal",
        Phase.WeylSemimetalWithPockets => "Weyl semimetal with pockets",
        Phase.DiracSemimetalWithPockets => "Dirac semimetal with pockets",
        Phase.NodalLine => "nodal line",
        Phase.HeavyMetal => "heavy Fermi liquid (metal)",
        Phase.Unresolved => "unresolved (refine and rerun)",
        _ => throw new ArgumentOutOfRangeException(nameof(phase), phase, "no readable name for this phase"),
    };

    /// <summary>
    /// The words for a phase given in its file form ("weyl-semimetal"); text that is not a phase name (another text
    /// column, a phase of a newer file) is returned as it is.
    /// </summary>
    public static string Readable(string fileName)
    {
        foreach (var p in Enum.GetValues<Phase>())
            if (Name(p) == fileName) return Readable(p);
        return fileName;
    }

    /// <summary>File form of a phase: lower-case words joined by '-'.</summary>
    public static string Name(Phase phase) => phase switch
    {
        Phase.Decoupled => "decoupled",
        Phase.KondoInsulator => "kondo-insulator",
        Phase.TrivialKondoInsulator => "trivial-kondo-insulator",
        Phase.WeakTopologicalKondoInsulator => "weak-topological-kondo-insulator",
        Phase.StrongTopologicalKondoInsulator => "strong-topological-kondo-insulator",
        Phase.TopologicalKondoInsulator => "topological-kondo-insulator",
        Phase.WeylSemimetal => "weyl-semimetal",
        Phase.DiracSemimetal => "dirac-semimetal",
        Phase.WeylSemimetalWithPockets => "weyl-semimetal-with-pockets",
        Phase.DiracSemimetalWithPockets => "dirac-semimetal-with-pockets",
        Phase.NodalLine => "nodal-line",
        Phase.Unresolved => "unresolved",
        _ => "heavy-metal",
    };
}
