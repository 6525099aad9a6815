namespace Meanfield.Solver;

/// <summary>How well the chemical potential is defined by the sampled states.</summary>
public enum FermiLevelStatus
{
    /// <summary>T &gt; 0, or T = 0 with a gap between the last occupied and the first empty sampled state.</summary>
    Regular,
    /// <summary>T = 0 and the Fermi level falls inside a band of sampled states (a metal on a discrete mesh).</summary>
    InsideBand,
    /// <summary>T = 0 and sampled states are degenerate exactly at the Fermi level (a touching point on the mesh).</summary>
    DegenerateAtFermiLevel,
}
