using Meanfield.Lattices;

namespace Meanfield.Analysis.Nodes;

/// <summary>Type I (closed Fermi surface at the node energy) or type II (tilt exceeds the cone in some direction).</summary>
public enum NodeType { TypeI, TypeII }

/// <summary>
/// A point where the highest occupied band n_occ - 1 and the lowest empty band n_occ touch (0-based bands).
/// Energies in the model's unit, wave vectors in inverse angstrom, velocities in energy unit x angstrom.
/// </summary>
/// <param name="Cartesian">Position k (inverse angstrom).</param>
/// <param name="Reduced">Position in reduced coordinates folded into [0, 1).</param>
/// <param name="EnergyOffset">Node energy minus the chemical potential: how far the node sits from pinning.</param>
/// <param name="Gap">Residual gap E_{n_occ} - E_{n_occ-1} at the refined position.</param>
/// <param name="Chirality">Nearest integer to <paramref name="FluxOver2Pi"/> (convention in <see cref="SphereChirality"/>).</param>
/// <param name="FluxOver2Pi">Raw Berry flux of the occupied bands through the sphere, over 2 pi.</param>
/// <param name="Velocity">Cone tensor sqrt(v v^T) (symmetric, 3 x 3; zeros beyond the lattice dimension).</param>
/// <param name="VelocitySingular">Its eigenvalues (the singular values of v), descending.</param>
/// <param name="DetVelocity">|det v|, which sets the DOS E^2 / (2 pi^2 |det v|) per node per volume.</param>
/// <param name="Tilt">Gradient of the mean energy of the two bands (energy unit x angstrom).</param>
/// <param name="TiltRatio">sqrt(w^T (v v^T)^-1 w): below 1 type I, above 1 type II.</param>
/// <param name="Degeneracy">Bands meeting at the node: 2 Weyl, 4 Dirac.</param>
/// <param name="Location">High-symmetry point ("X") or line ("on X-W") it lies on, or null.</param>
public sealed record WeylNode(
    Vec3 Cartesian, Vec3 Reduced, double EnergyOffset, double Gap, int Chirality, double FluxOver2Pi,
    double[,] Velocity, double[] VelocitySingular, double DetVelocity, Vec3 Tilt, double TiltRatio,
    int Degeneracy, string? Location)
{
    public NodeType Type => TiltRatio > 1 ? NodeType.TypeII : NodeType.TypeI;
    public bool IsDirac => Degeneracy >= 4;
}
