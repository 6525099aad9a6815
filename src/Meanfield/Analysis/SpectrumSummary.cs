using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Analysis.Topology;
using Meanfield.Heat;
using Meanfield.Lattices;
using Meanfield.Solutions;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Analysis;

/// <summary>What a digest should contain beyond the phase label, which is always computed.</summary>
public sealed record SpectrumRequest
{
    /// <summary>Coarse mesh of the node search (default <see cref="NodeSearchOptions.DefaultMesh"/>; 4 to 96).</summary>
    public int SearchMesh { get; init; } = NodeSearchOptions.DefaultMesh;
    /// <summary>Compute the DOS at mu (tetrahedra on the solution's own mesh, shifted or not as it was solved) and gamma (default true).</summary>
    public bool Dos { get; init; } = true;
    /// <summary>Compute the node heat coefficient beta (default true).</summary>
    public bool Heat { get; init; } = true;
    /// <summary>
    /// Give a Kondo insulator its topological class from the invariants of the filled bands (Z2, or the 2D Chern number
    /// without time reversal), computed with the search mesh as gap-check mesh; with inversion symmetry by the parity formula alone (default true).
    /// </summary>
    public bool Topology { get; init; } = true;
}

/// <summary>
/// The one per-solution spectral digest: gaps, the node search, the DOS at mu, the phase label and the flat columns
/// written to files. `solve`, `nodes`, `dos`, `heat`, `scan` and the solution JSON all read it from
/// <see cref="SpectrumSummary.Compute"/>.
/// </summary>
/// <param name="Mu">The chemical potential everything is measured from (the solution's).</param>
/// <param name="Phase">The phase label (<see cref="PhaseClassifier"/>), null for momentum-free lattices.</param>
/// <param name="Gaps">Gaps between bands n_occ - 1 and n_occ (null for a partly filled band or no k-space).</param>
/// <param name="Nodes">The node search (null for a partly filled band or no k-space).</param>
/// <param name="DosAtMu">DOS at mu when asked for; for a decoupled solution the conduction part, with Correlated NaN (not a band: read <see cref="SpectrumColumns.DosFermiCorrelated"/>, which is null then).</param>
/// <param name="Columns">The flat numbers for files.</param>
/// <param name="Invariants">The invariants of a Kondo insulator's filled bands when asked for; null otherwise.</param>
public sealed record SpectrumDigest(double Mu, PhaseLabel? Phase, GapReport? Gaps, NodeSearchResult? Nodes, DosValue? DosAtMu,
                                    SpectrumColumns Columns, InvariantReport? Invariants = null);

/// <summary>Computes the <see cref="SpectrumDigest"/> of a <see cref="Solution"/>.</summary>
public static class SpectrumSummary
{
    /// <summary>The digest of <paramref name="solution"/> for <paramref name="request"/> (defaults when null).</summary>
    /// <exception cref="ArgumentOutOfRangeException">A search mesh outside 4..96.</exception>
    public static SpectrumDigest Compute(Solution solution, SpectrumRequest? request = null)
    {
        var req = request ?? new SpectrumRequest();
        if (req.SearchMesh is < 4 or > 96) throw new ArgumentOutOfRangeException(nameof(request), $"search mesh {req.SearchMesh}: use 4..96 divisions");
        var model = solution.Model;
        double mu = solution.Mu;
        if (model.IsMomentumFree || solution.Mesh is null)
        {
            var label = solution.Decoupled ? new PhaseLabel(Phase.Decoupled, "all boson amplitudes vanish (r = 0)") : null;
            return new(mu, label, null, null, null, new SpectrumColumns { Phase = label?.Name, PhaseReason = label?.Reason });
        }
        // One pass over the solution's own mesh serves the DOS at mu, the gaps and the node seeds: the solve's final
        // pass when it was kept, otherwise a fresh one over the irreducible wedge (energies and kind weights are the
        // same across an orbit; tetrahedra read every corner through the orbit map).
        var wedge = new Lazy<global::Meanfield.Symmetry.IrreducibleMesh>(() => solution.FinalPass?.Wedge
            ?? new global::Meanfield.Symmetry.IrreducibleMesh(solution.Mesh, global::Meanfield.Symmetry.SymmetryGroup.Find(new Bloch.BlochHamiltonian(model))));
        var pass = new Lazy<ZonePass>(() => solution.FinalPass ?? PassDos.Diagonalise(solution.Hamiltonian, wedge.Value));
        DosValue? dos = null;
        // Decoupled f shells are a flat level pinned at mu: a delta function, not a band, so the DOS at mu is the
        // conduction part alone and the correlated part is not reported (free moments carry entropy, not a gamma).
        if (solution.Decoupled) { var c = PassDos.DecoupledConductionAt(model, wedge.Value, mu); dos = new DosValue(c, double.NaN, c); }
        else if (req.Dos) dos = PassDos.AtEnergy(pass.Value, mu);
        GapReport? gaps = null;
        NodeSearchResult? nodes = null;
        if (solution.WholeFilling && !solution.Decoupled)
        {
            int occ = solution.OccupiedBands;
            var options = new NodeSearchOptions { Mesh = req.SearchMesh, Temperature = solution.Temperature };
            nodes = solution.PlacementNodes is { } p && p.ChemicalPotential == mu && req.SearchMesh == NodeSearchOptions.DefaultMesh && solution.Temperature == 0
                ? p : NodeSearch.Find(solution.Hamiltonian, occ, mu, options, pass.Value);
            gaps = Gaps(pass.Value, occ, nodes);
        }
        var phase = PhaseClassifier.Classify(solution.Decoupled, solution.WholeFilling, gaps, nodes);
        InvariantReport? invariants = null;
        if (req.Topology && phase.Phase == Phase.KondoInsulator)
        {
            // The digest's own search is the gap check: a Kondo insulator label already says it found no touching.
            var check = nodes is not null && gaps is not null ? GapCheckResult.From(nodes, gaps) : null;
            invariants = InvariantReport.Compute(solution.Hamiltonian, solution.OccupiedBands,
                new Z2Options { GapMesh = req.SearchMesh, ParityAloneWhenInversion = true, Gap = check });
            phase = PhaseClassifier.WithTopology(phase, invariants);
        }
        double? beta = null;
        if (req.Heat && nodes is not null && phase.Phase is Phase.WeylSemimetal or Phase.DiracSemimetal
            && FermiLevelNodes.From(nodes, model, mu, nodes.Tolerances.Pinning) is { Cones: > 0 } fln)
            beta = 1e3 * fln.MolarBeta;
        var columns = new SpectrumColumns
        {
            Phase = phase.Name, PhaseReason = phase.Reason,
            DirectGap = gaps?.Direct, IndirectGap = gaps?.Indirect,
            DosFermiTotal = dos?.Total, DosFermiCorrelated = dos is { } dv && double.IsFinite(dv.Correlated) ? dv.Correlated : null,
            NodeCount = nodes?.Nodes.Count, PinnedNodes = nodes?.Nodes.Count(n => n.Pinning == NodePinning.Pinned),
            MaxNodeOffset = nodes is null ? null : nodes.Nodes.Count == 0 ? 0 : nodes.Nodes.Max(n => Math.Abs(n.EnergyOffset)),
            NetChirality = nodes?.ChiralitySum, AbsChirality = nodes?.AbsChirality,
            GammaMilliJoulePerMolK2 = req.Dos && dos is { } d ? 1e3 * SommerfeldGamma(d.Total, model) : null,
            BetaMilliJoulePerMolK4 = beta,
            Z2 = invariants?.Z2.Indices?.ToString(),
            ChernNumber = invariants?.Chern?.Chern,
        };
        return new(mu, phase, gaps, nodes, dos, columns, invariants);
    }

    // Gaps on the solution's mesh, with the refined nodes included: a touching between mesh points closes the gap.

    private static GapReport Gaps(ZonePass pass, int occ, NodeSearchResult nodes)
    {
        var g = GapFinder.Find(pass, occ);
        if (nodes.Nodes.Count == 0) return g;
        var lowest = nodes.Nodes.MinBy(n => n.Gap)!;
        double hi = nodes.Nodes.Max(n => n.Energy), lo = nodes.Nodes.Min(n => n.Energy);
        var (vmax, vAt) = hi > g.ValenceMaximum ? (hi, nodes.Nodes.MaxBy(n => n.Energy)!.Cartesian) : (g.ValenceMaximum, g.ValenceMaximumAt);
        var (cmin, cAt) = lo < g.ConductionMinimum ? (lo, nodes.Nodes.MinBy(n => n.Energy)!.Cartesian) : (g.ConductionMinimum, g.ConductionMinimumAt);
        var (direct, dAt) = lowest.Gap < g.Direct ? (lowest.Gap, lowest.Cartesian) : (g.Direct, g.DirectAt);
        return g with { Direct = direct, DirectAt = dAt, ValenceMaximum = vmax, ValenceMaximumAt = vAt, ConductionMinimum = cmin,
                        ConductionMinimumAt = cAt, Indirect = cmin - vmax };
    }

    /// <summary>
    /// gamma = (pi^2/3) k_B^2 rho(E_F) (Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 2), rho per energy unit per
    /// cell, as J mol^-1 K^-2 per mole of formula units.
    /// </summary>
    public static double SommerfeldGamma(double dosPerUnitPerCell, Binding.BoundModel model) =>
        HeatUnits.MolarFromPerCell(Math.PI * Math.PI / 3 * dosPerUnitPerCell / model.Unit.Kelvins(), model.FormulaUnitsPerCell);
}
