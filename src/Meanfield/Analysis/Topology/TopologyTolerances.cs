namespace Meanfield.Analysis.Topology;

/// <summary>
/// The tolerances of the invariant calculations, each relative to the scale it judges, documented once.
/// </summary>
public static class TopologyTolerances
{
    /// <summary>
    /// A symmetry (inversion, time reversal, a point operation) holds when H(gk) and U H(k) U^dag differ by less than
    /// this fraction of the largest |H_ij| at the sampled k-points: round-off of the assembly is about 1e-15 of it, a
    /// real symmetry breaking of interest is far above 1e-8.
    /// </summary>
    public const double SymmetryDefect = 1e-8;

    /// <summary>
    /// A parity count (n_occ - Tr P) / 2 must lie this close to an integer; the trace of a projected involution is an
    /// integer up to round-off when the occupied subspace is invariant (gapped at the TRIM).
    /// </summary>
    public const double ParityCount = 1e-6;

    /// <summary>
    /// Wannier-centre flow: a step of the pumping parameter is trusted when, at each end, the centres keep at least
    /// this fraction of the largest gap (between neighbouring centres at the other end) away from the other end's gap
    /// midpoint; otherwise the step is halved (Soluyanov &amp; Vanderbilt, PRB 83, 235401 (2011), Sec. IV: the midpoint
    /// must not be overtaken unseen).
    /// </summary>
    public const double FlowClearance = 0.25;

    /// <summary>Halvings of one flow step at most before the flow is declared unresolved.</summary>
    public const int FlowMaxBisections = 10;

    /// <summary>
    /// A link det &lt;u(k)|u(k')&gt; of the occupied subspace between neighbouring Wilson-loop points must keep at least
    /// this magnitude (1 for an unchanged subspace); below it the loop is too coarse for the subspace's rotation.
    /// </summary>
    public const double LinkMagnitudeFloor = 0.2;
}
