namespace Meanfield.Analysis.Nodes;

/// <summary>Knobs of the node search. Relative tolerances are fractions of the total bandwidth.</summary>
public sealed record NodeSearchOptions
{
    /// <summary>Coarse mesh divisions per reciprocal vector.</summary>
    public int Mesh { get; init; } = 16;
    /// <summary>A refined minimum is a node when its gap is below this fraction of the bandwidth.</summary>
    public double GapTolerance { get; init; } = 1e-8;
    /// <summary>Most coarse local minima refined (lowest gaps first).</summary>
    public int MaxCandidates { get; init; } = 96;
    /// <summary>Bands within this fraction of the bandwidth of the node energy count in its degeneracy.</summary>
    public double DegeneracyTolerance { get; init; } = 1e-5;
    /// <summary>Theta and phi divisions of the chirality sphere.</summary>
    public int SphereTheta { get; init; } = 24;
    public int SpherePhi { get; init; } = 48;
    /// <summary>More distinct nodes than this suggests a nodal line.</summary>
    public int NodalLineCount { get; init; } = 48;
}
