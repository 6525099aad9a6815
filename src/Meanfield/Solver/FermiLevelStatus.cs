namespace Meanfield.Solver;

/// <summary>How well the chemical potential is defined by the sampled states.</summary>
public enum FermiLevelStatus
{
    /// <summary>
    /// T &gt; 0; or T = 0 on a k-mesh, where the tetrahedron count N(mu) = N_e is met (metal or insulator alike); or
    /// T = 0 on a quadrature with a gap between the last occupied and the first empty sampled state.
    /// </summary>
    Regular,
    /// <summary>T = 0 on a quadrature and the Fermi level falls inside a band of sampled states.</summary>
    InsideBand,
    /// <summary>
    /// T = 0 and states are degenerate at the Fermi level: on a quadrature, sampled states exactly at mu; on a k-mesh, a
    /// dispersionless band at mu, so that no single mu meets the tetrahedron count.
    /// </summary>
    DegenerateAtFermiLevel,
}
