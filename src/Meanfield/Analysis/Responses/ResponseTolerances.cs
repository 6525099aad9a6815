namespace Meanfield.Analysis.Responses;

/// <summary>The tolerances of the Berry-curvature responses, each relative to the scale it judges, documented once.</summary>
public static class ResponseTolerances
{
    /// <summary>
    /// Two bands at one k count as degenerate (their pair is left out of the Kubo sum) when their energies differ by
    /// less than this fraction of the largest |E_n| at that k. Within a degenerate, equally occupied multiplet the
    /// left-out terms cancel pairwise, so the multiplet's total curvature is exact; Kramers pairs are degenerate to
    /// round-off (1e-15 of the scale), far below this.
    /// </summary>
    public const double Degeneracy = 1e-9;

    /// <summary>
    /// Default refinement threshold: a mesh cell is subdivided when |Omega_n| h^2 (the Berry flux through a cell face of
    /// edge h, radians) exceeds this for a band inside the energy window. Below about 0.1 rad a face is smooth enough
    /// for the midpoint rule; Weyl-node and avoided-crossing spikes exceed it (Wang, Yates, Souza &amp; Vanderbilt,
    /// PRB 74, 195118 (2006), adaptive refinement of the anomalous Hall integrand).
    /// </summary>
    public const double RefinementFlux = 0.1;
}
