using Meanfield.Lattices;

namespace Meanfield.Analysis.Nodes;

/// <summary>Type I (closed Fermi surface at the node energy) or type II (tilt exceeds the cone in some direction).</summary>
public enum NodeType { TypeI, TypeII }

/// <summary>Where a node sits against the chemical potential, judged by <see cref="SpectrumTolerances.Pinning"/>.</summary>
public enum NodePinning
{
    /// <summary>|E_node - mu| within max(k_B T, the pinning fraction of the band-pair width).</summary>
    Pinned,
    /// <summary>The node lies above mu: electron pockets around it at T = 0.</summary>
    Above,
    /// <summary>The node lies below mu: hole pockets around it at T = 0.</summary>
    Below,
}

/// <summary>
/// A point where the highest occupied band n_occ - 1 and the lowest empty band n_occ touch (0-based bands, counted from
/// the electron number whatever mu does). Energies in the model's unit, wave vectors in inverse angstrom, velocities in
/// energy unit x angstrom. No field is ever NaN: what could not be determined is null.
/// </summary>
/// <param name="Cartesian">Position k (inverse angstrom), the image nearest Gamma.</param>
/// <param name="Reduced">Position in reduced coordinates folded into [0, 1).</param>
/// <param name="Energy">Node energy, the mean of the two touching bands (energy unit).</param>
/// <param name="EnergyOffset">Node energy minus the chemical potential.</param>
/// <param name="Pinning">Pinned at mu, above or below it.</param>
/// <param name="Gap">Residual gap E_{n_occ} - E_{n_occ-1} at the refined position.</param>
/// <param name="Chirality">Monopole charge from a converged Berry flux (convention in <see cref="SphereChirality"/>); null
/// when undetermined, and always null in two dimensions (where a point node has no monopole charge).</param>
/// <param name="FluxOver2Pi">Berry flux of the occupied bands through the last sphere tried, over 2 pi; null in 2D.</param>
/// <param name="SphereRadius">Radius of that sphere (inverse angstrom; 0 in 2D).</param>
/// <param name="Velocity">Cone tensor sqrt(v v^T) (symmetric, 3 x 3; zeros beyond the lattice dimension).</param>
/// <param name="VelocitySingular">Its eigenvalues (the singular values of v), descending.</param>
/// <param name="DetVelocity">|det v|, which sets the DOS E^2 / (2 pi^2 |det v| (1 - w^2)^2) per node per volume.</param>
/// <param name="Tilt">Gradient of the mean energy of the two bands (energy unit x angstrom).</param>
/// <param name="TiltRatio">|w| = sqrt(w^T (v v^T)^-1 w): below 1 type I, above 1 type II.</param>
/// <param name="Degeneracy">Bands meeting at the node: 2 Weyl, 4 Dirac.</param>
/// <param name="Location">High-symmetry point ("X") or line ("on X-W") it lies on, or null.</param>
/// <param name="Orbit">Index of its orbit: nodes one lattice operation maps onto each other at the same energy share it.</param>
public sealed record WeylNode(
    Vec3 Cartesian, Vec3 Reduced, double Energy, double EnergyOffset, NodePinning Pinning, double Gap,
    int? Chirality, double? FluxOver2Pi, double SphereRadius,
    double[,] Velocity, double[] VelocitySingular, double DetVelocity, Vec3 Tilt, double TiltRatio,
    int Degeneracy, string? Location, int Orbit)
{
    /// <summary>Type I below tilt ratio 1, type II above.</summary>
    public NodeType Type => TiltRatio > 1 ? NodeType.TypeII : NodeType.TypeI;
    /// <summary>Four or more bands meet: a Dirac node.</summary>
    public bool IsDirac => Degeneracy >= 4;
}
