namespace Meanfield.Analysis;

/// <summary>
/// The flat numbers of a <see cref="SpectrumDigest"/>, as every file writes them (the solution JSON, scan rows, the node
/// report): one definition, so two outputs cannot disagree. Energies in the model's unit; DOS in states per cell per
/// energy unit (all flavours). Null where the quantity is not defined for the solution or was not asked for; never NaN.
/// </summary>
public sealed record SpectrumColumns
{
    /// <summary>Phase label in file form ("weyl-semimetal", ...); null for momentum-free lattices.</summary>
    public string? Phase { get; init; }
    /// <summary>Why the label was given, in plain words.</summary>
    public string? PhaseReason { get; init; }
    /// <summary>min_k [E_nocc(k) - E_nocc-1(k)] on the coarse mesh and the refined nodes.</summary>
    public double? DirectGap { get; init; }
    /// <summary>min_k E_nocc - max_k E_nocc-1 (negative when the bands overlap).</summary>
    public double? IndirectGap { get; init; }
    /// <summary>Total DOS at mu (tetrahedra); for a decoupled solution the conduction part alone (the free f moments are a flat level at mu, a delta function).</summary>
    public double? DosFermiTotal { get; init; }
    /// <summary>DOS at mu on the correlated orbitals; null for a decoupled solution (free moments, no band).</summary>
    public double? DosFermiCorrelated { get; init; }
    /// <summary>Touchings of bands n_occ - 1 and n_occ.</summary>
    public int? NodeCount { get; init; }
    /// <summary>Those within the pinning tolerance of mu.</summary>
    public int? PinnedNodes { get; init; }
    /// <summary>Largest |E_node - mu| (0 without nodes).</summary>
    public double? MaxNodeOffset { get; init; }
    /// <summary>Sum of chiralities; null when some chirality is undetermined (or in 2D).</summary>
    public int? NetChirality { get; init; }
    /// <summary>Sum of |chirality| over the determined chiralities.</summary>
    public int? AbsChirality { get; init; }
    /// <summary>Sommerfeld coefficient gamma from the DOS at mu (mJ mol^-1 K^-2).</summary>
    public double? GammaMilliJoulePerMolK2 { get; init; }
    /// <summary>T^3 coefficient of the pinned type-I cones (mJ mol^-1 K^-4).</summary>
    public double? BetaMilliJoulePerMolK4 { get; init; }
    /// <summary>Z2 indices of a Kondo insulator's filled bands, "(nu0;nu1nu2nu3)" in 3D or "nu" in 2D; null when not determined or not a Kondo insulator.</summary>
    public string? Z2 { get; init; }
    /// <summary>Chern number of a 2D Kondo insulator without time reversal; null otherwise.</summary>
    public int? ChernNumber { get; init; }
}
