using System.Globalization;
using Meanfield.Analysis.Symmetry;
using Meanfield.Bloch;
using Meanfield.Units;

namespace Meanfield.Analysis.Topology;

/// <summary>Settings of <see cref="Z2Invariants.Compute"/>; the defaults suit models of up to a few tens of bands.</summary>
public sealed record Z2Options
{
    /// <summary>Coarse mesh of the gap check (node search), divisions per axis, 4..96. Default 12.</summary>
    public int GapMesh { get; init; } = 12;
    /// <summary>Initial pump steps over half a plane (refined where the flow needs it), at least 2. Default 16.</summary>
    public int PumpSteps { get; init; } = 16;
    /// <summary>k-points per Wilson loop, at least 4; doubled up to twice when a link is too small. Default 32.</summary>
    public int LoopPoints { get; init; } = 32;
    /// <summary>Give the indices of the lowest bands even when they overlap the next band in energy (no indirect gap). Default false.</summary>
    public bool AllowBandOverlap { get; init; }
    /// <summary>
    /// When inversion is a symmetry and every TRIM parity is resolved, stop at the parity formula and skip the
    /// Wannier-centre flow (a few hundred times cheaper; what phase labels of scan points use). Default false: both
    /// methods, and their agreement reported.
    /// </summary>
    public bool ParityAloneWhenInversion { get; init; }
    /// <summary>
    /// A gap check already made for the same Hamiltonian and filling (the spectrum digest's node search), used instead
    /// of a fresh search on <see cref="GapMesh"/>. Default null: search.
    /// </summary>
    public GapCheckResult? Gap { get; init; }
}

/// <summary>
/// The Z2 indices of the lowest <see cref="Occupied"/> bands, by the parity formula (when inversion is a symmetry) and
/// by the Wannier-centre flow (always), with the state of the answer.
/// </summary>
/// <param name="Status">Determined, or why not (gapless, not applicable, unresolved).</param>
/// <param name="Reason">One plain sentence explaining the status.</param>
/// <param name="Dimension">2 or 3.</param>
/// <param name="Occupied">Number of bands whose invariants are asked for.</param>
/// <param name="Indices">The answer when determined (both methods agree, or the flow alone); null otherwise.</param>
/// <param name="FromParity">Indices from the TRIM parities, or null (no inversion, or unresolved parities).</param>
/// <param name="Trims">The TRIM parities behind <see cref="FromParity"/> (empty without inversion).</param>
/// <param name="Inversion">The inversion operation found, or null.</param>
/// <param name="FromFlow">Indices from the Wannier-centre flow, or null (not run, or unresolved).</param>
/// <param name="Flows">The flows: six planes in 3D (u_i = 0 and 1/2 for i = 1, 2, 3 in that order), one in 2D.</param>
/// <param name="Gap">The gap check.</param>
/// <param name="TimeReversalDefect">Relative defect of the spin-1/2 time reversal (0 for a symmetric model).</param>
public sealed record Z2Result(
    InvariantStatus Status, string Reason, int Dimension, int Occupied, Z2Indices? Indices,
    Z2Indices? FromParity, IReadOnlyList<TrimParity> Trims, SpaceOperation? Inversion,
    Z2Indices? FromFlow, IReadOnlyList<WannierFlow> Flows, GapCheckResult? Gap, double TimeReversalDefect)
{
    /// <summary>True when both methods ran and gave the same indices; null when only one applied.</summary>
    public bool? MethodsAgree => FromParity is null || FromFlow is null ? null : FromParity.SameAs(FromFlow);
}

/// <summary>
/// Entry point for the Z2 invariants of a time-reversal-invariant insulator (2D: nu; 3D: (nu0; nu1 nu2 nu3)).
/// Fu &amp; Kane, PRB 76, 045302 (2007) (parities); Soluyanov &amp; Vanderbilt, PRB 83, 235401 (2011) and Yu, Qi,
/// Bernevig, Fang &amp; Dai, PRB 84, 075119 (2011) (Wannier-centre flow).
/// </summary>
public static class Z2Invariants
{
    /// <summary>
    /// The Z2 indices of the lowest <paramref name="occupied"/> bands of <paramref name="source"/>. Never throws for a
    /// gapless or time-reversal-broken spectrum: the result says so in <see cref="Z2Result.Status"/>.
    /// </summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Size-1.</exception>
    public static Z2Result Compute(IBlochSource source, int occupied, Z2Options? options = null)
    {
        var opt = options ?? new Z2Options();
        var model = source.Model;
        int dim = model.Lattice.Dimension;
        if (dim < 2) throw new ArgumentException($"{model.Name}: a lattice without momentum has no Z2 index.");
        if (occupied < 1 || occupied >= source.Size)
            throw new ArgumentOutOfRangeException(nameof(occupied), $"occupied bands {occupied} must lie in 1..{source.Size - 1}");
        var inv = CultureInfo.InvariantCulture;
        Z2Result Fail(InvariantStatus s, string why, GapCheckResult? gap = null, double trd = 0) =>
            new(s, why, dim, occupied, null, null, [], null, null, [], gap, trd);

        double trDefect = ModelSymmetry.TimeReversalDefect(source);
        if (model.Flavours != 2)
            return Fail(InvariantStatus.NotApplicable, $"the Z2 index needs spin-1/2 (Kramers) time reversal; the model has {model.Flavours} flavour(s)", null, trDefect);
        if (trDefect > TopologyTolerances.SymmetryDefect)
            return Fail(InvariantStatus.NotApplicable, string.Create(inv,
                $"time reversal is broken (relative defect {trDefect:G3}): the Z2 index is not defined; a Chern number or the anomalous Hall conductivity describes this case"), null, trDefect);
        if (occupied % 2 != 0)
            return Fail(InvariantStatus.Gapless, $"{occupied} occupied bands with time reversal split a Kramers pair: no gap at this filling", null, trDefect);

        var gap = opt.Gap ?? GapCheckResult.Run(source, occupied, opt.GapMesh);
        if (!gap.HasDirectGap)
            return Fail(InvariantStatus.Gapless, $"bands {occupied - 1} and {occupied} touch at {gap.Nodes} point(s) (search mesh {gap.Mesh})", gap, trDefect);
        if (gap.IndirectGap <= 0 && !opt.AllowBandOverlap)
            return Fail(InvariantStatus.Gapless, string.Create(inv,
                $"bands {occupied - 1} and {occupied} overlap in energy by {-gap.IndirectGap:G4} {model.Unit.Symbol()}: no gap at this filling"), gap, trDefect);

        var inversion = ModelSymmetry.FindInversion(source);
        IReadOnlyList<TrimParity> trims = [];
        Z2Indices? fromParity = null;
        var notes = new List<string>();
        if (inversion is not null)
        {
            trims = ParityInvariants.AtTrim(source, inversion, occupied);
            if (trims.All(t => t.Resolved)) fromParity = ParityInvariants.Indices(trims, dim);
            else notes.Add("the parities at some TRIM are not resolved");
        }

        var flows = fromParity is not null && opt.ParityAloneWhenInversion ? [] : Flows(source, occupied, dim, opt);
        Z2Indices? fromFlow = null;
        if (flows.Count == 0) { }
        else if (flows.Any(f => !f.Resolved)) notes.Add("the Wannier-centre flow is not resolved on some plane");
        else if (dim == 2) fromFlow = new Z2Indices(2, flows[0].Z2, []);
        else
        {
            var strong = Enumerable.Range(0, 3).Select(i => (flows[2 * i].Z2 + flows[2 * i + 1].Z2) % 2).Distinct().ToList();
            if (strong.Count == 1) fromFlow = new Z2Indices(3, strong[0], [flows[1].Z2, flows[3].Z2, flows[5].Z2]);
            else notes.Add("the planes u_i = 0 and 1/2 give different strong indices for different i");
        }

        Z2Indices? answer = null;
        InvariantStatus status;
        string reason;
        if (fromParity is not null && fromFlow is not null && !fromParity.SameAs(fromFlow))
        {
            status = InvariantStatus.Unresolved;
            reason = $"the parity formula gives {fromParity} but the Wannier-centre flow gives {fromFlow}";
        }
        else if ((answer = fromFlow ?? fromParity) is not null)
        {
            status = InvariantStatus.Determined;
            reason = (fromParity is not null && fromFlow is not null ? "parity formula and Wannier-centre flow agree"
                : fromFlow is not null ? "Wannier-centre flow (no inversion symmetry for the parity formula)" : "parity formula")
                + (notes.Count > 0 ? "; " + string.Join("; ", notes) : "");
        }
        else
        {
            status = InvariantStatus.Unresolved;
            reason = string.Join("; ", notes);
        }
        return new Z2Result(status, reason, dim, occupied, answer, fromParity, trims, inversion, fromFlow, flows, gap, trDefect);
    }

    // Six planes in 3D (axis i at 0 then 1/2), one in 2D; loops doubled (twice at most) while a link is too small.
    private static List<WannierFlow> Flows(IBlochSource source, int occupied, int dim, Z2Options opt)
    {
        var planes = dim == 2 ? [(2, 0.0)] : new List<(int, double)> { (0, 0), (0, 0.5), (1, 0), (1, 0.5), (2, 0), (2, 0.5) };
        var result = new List<WannierFlow>();
        foreach (var (axis, value) in planes)
        {
            int pump = dim == 2 ? 0 : (axis + 1) % 3;
            WannierFlow flow = WannierCentreFlow.Compute(source, occupied, axis, value, pump, opt.PumpSteps, opt.LoopPoints);
            for (int more = 1; more <= 2 && flow.MinimumLink < TopologyTolerances.LinkMagnitudeFloor; more++)
                flow = WannierCentreFlow.Compute(source, occupied, axis, value, pump, opt.PumpSteps, opt.LoopPoints << more);
            if (flow.MinimumLink < TopologyTolerances.LinkMagnitudeFloor) flow = flow with { Resolved = false };
            result.Add(flow);
        }
        return result;
    }
}
