namespace Meanfield.Analysis.Nodes;

/// <summary>Knobs of the node search. Energy and distance tolerances live in <see cref="SpectrumTolerances"/>.</summary>
public sealed record NodeSearchOptions
{
    /// <summary>The default coarse mesh: divisions per reciprocal vector of the gap scan that seeds the refinement.</summary>
    public const int DefaultMesh = 16;
    /// <summary>
    /// Coarse mesh divisions per reciprocal vector (default 16; 4 or more). A pass handed to the search over a mesh at
    /// least this fine (the solve's own) is used instead of a fresh Gamma-centred mesh.
    /// </summary>
    public int Mesh { get; init; } = DefaultMesh;
    /// <summary>k_B T in the energy unit (default 0): a node within it of mu counts as pinned.</summary>
    public double Temperature { get; init; }
    /// <summary>Most coarse local minima refined, lowest gaps first (default 96).</summary>
    public int MaxCandidates { get; init; } = 96;
    /// <summary>More distinct nodes than this suggests a nodal line (default 48).</summary>
    public int NodalLineCount { get; init; } = 48;
    /// <summary>Complete every node's orbit under the lattice's point operations (default true).</summary>
    public bool CompleteOrbits { get; init; } = true;
}
