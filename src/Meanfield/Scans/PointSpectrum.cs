using Meanfield.Analysis;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Heat;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Scans;

/// <summary>
/// The per-point spectrum columns of a scan row (gaps, Fermi-level DOS, nodes, heat coefficients, phase label).
/// Energies in the model's unit. Fields left null were not requested or do not apply.
/// </summary>
public sealed record PointSpectrumColumns
{
    public double? DirectGap { get; init; }
    public double? IndirectGap { get; init; }
    public double? DosFermiTotal { get; init; }
    public double? DosFermiCorrelated { get; init; }
    public int? NodeCount { get; init; }
    public double? MaxNodeOffset { get; init; }
    public int? NetChirality { get; init; }
    public int? AbsChirality { get; init; }
    public double? GammaMilliJoulePerMolK2 { get; init; }
    public double? BetaMilliJoulePerMolK4 { get; init; }
    public string? Phase { get; init; }
}

/// <summary>
/// Computes <see cref="PointSpectrumColumns"/> from the renormalized bands of one solution. This is the single place
/// to swap in a shared spectrum summary: everything else in the scan layer only sees the record.
/// </summary>
public static class PointSpectrum
{
    /// <param name="renormalized">H_MF(k) of the solution.</param>
    /// <param name="model">The bound model (lattice, electron count, units).</param>
    /// <param name="mu">Chemical potential (energy unit).</param>
    /// <param name="decoupled">True on the r = 0 branch.</param>
    /// <param name="mesh">k-mesh divisions of the solve; the gap is taken on the same (shifted or not) mesh.</param>
    /// <param name="columns">Which costly columns to compute.</param>
    public static PointSpectrumColumns Compute(IBlochSource renormalized, BoundModel model, double mu, bool decoupled,
                                               KMesh mesh, ScanColumnRequest columns)
    {
        if (decoupled) return new PointSpectrumColumns { Phase = Label(Analysis.Phase.Decoupled) };
        if (model.IsMomentumFree) return new PointSpectrumColumns();
        double ne = model.ElectronsPerCell;
        int occupied = (int)Math.Round(ne);
        bool integerFilling = Math.Abs(ne - occupied) < 1e-9 && occupied >= 1 && occupied < renormalized.Size;

        GapReport? gap = integerFilling ? GapFinder.Find(renormalized, mesh, occupied) : null;
        DosValue? dos = null;
        if (columns.Dos || columns.Heat)
            dos = new TetrahedronDos(renormalized, new KMesh(model.Lattice, mesh.N1, mesh.N2, mesh.N3, shifted: false)).DosAtEnergy(mu);
        NodeSearchResult? nodes = null;
        if (columns.Nodes && integerFilling && model.Lattice.Dimension == 3)
            nodes = NodeSearch.Find(renormalized, occupied, mu, new NodeSearchOptions { Mesh = Math.Max(8, mesh.N1) });

        double width = NodeWidth(renormalized, mesh);
        var tolerances = SpectrumSummary.Tolerances(width, 0);
        List<WeylNode> pinned = nodes is null ? [] : nodes.Nodes.Where(n => Math.Abs(n.EnergyOffset) < tolerances.EnergyTolerance).ToList();

        PhaseLabel label;
        if (!integerFilling)
            label = new PhaseLabel(Analysis.Phase.HeavyMetal, "non-integer electron count: a Fermi surface (Luttinger count)");
        else
            label = PhaseClassifier.Classify(false, gap!, nodes, dos?.Total ?? 0, tolerances);

        double? beta = null;
        if (columns.Heat && pinned.Count > 0 && pinned.All(n => n.DetVelocity > 0))
        {
            var heat = new NodeHeat(model.Unit, model.Lattice.CellVolume, model.FormulaUnitsPerCell);
            beta = 1e3 * pinned.Sum(n => heat.MolarBeta(n.DetVelocity));
        }
        return new PointSpectrumColumns
        {
            DirectGap = gap?.Direct,
            IndirectGap = gap?.Indirect,
            DosFermiTotal = columns.Dos ? dos?.Total : null,
            DosFermiCorrelated = columns.Dos ? dos?.Correlated : null,
            NodeCount = nodes?.Nodes.Count,
            MaxNodeOffset = nodes is null ? null : nodes.Nodes.Count == 0 ? 0 : nodes.Nodes.Max(n => Math.Abs(n.EnergyOffset)),
            NetChirality = nodes?.ChiralitySum,
            AbsChirality = nodes?.Nodes.Sum(n => Math.Abs(n.Chirality)),
            GammaMilliJoulePerMolK2 = columns.Heat && dos is { } d ? 1e3 * SommerfeldGamma(d.Total, model) : null,
            BetaMilliJoulePerMolK4 = beta,
            Phase = Label(label.Phase),
        };
    }

    /// <summary>
    /// gamma = (pi^2/3) k_B^2 rho(E_F) (Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 2), rho per energy unit per
    /// cell, as J mol^-1 K^-2 per mole of formula units.
    /// </summary>
    public static double SommerfeldGamma(double dosPerUnitPerCell, BoundModel model) =>
        HeatUnits.MolarFromPerCell(Math.PI * Math.PI / 3 * dosPerUnitPerCell / model.Unit.Kelvins(), model.FormulaUnitsPerCell);

    /// <summary>The phase as written in the phase column: the same names as `solve` and `nodes` use.</summary>
    public static string Label(Phase phase) => SpectrumSummary.Name(phase);

    private static double NodeWidth(IBlochSource source, KMesh mesh)
    {
        var sp = MeshSpectrum.Compute(source, new KMesh(mesh.Lattice, 4, 4, 4, shifted: false), withProjections: false);
        var (lo, hi) = sp.Range();
        return Math.Max(hi - lo, 1e-300);
    }
}
