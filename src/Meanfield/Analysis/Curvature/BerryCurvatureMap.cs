using Meanfield.Lattices;

namespace Meanfield.Analysis.Curvature;

/// <summary>
/// Berry curvature of the occupied bands on a plane of the zone, one value per plaquette of an n1 x n2 grid.
/// Omega[i, j] is the curvature component along the unit normal (span1 x span2 direction) in square angstrom,
/// Flux[i, j] the Berry flux through the plaquette in radians. When the plane is a full torus of the zone (integer
/// spans) <see cref="ChernNumber"/> is the total flux over 2 pi, an integer up to rounding.
/// </summary>
public sealed record BerryCurvatureMap(
    Vec3 Origin, Vec3 Span1, Vec3 Span2, Vec3 Normal, int N1, int N2,
    Vec3[,] CentreReduced, Vec3[,] CentreCartesian, double[,] Omega, double[,] Flux,
    double TotalFluxOver2Pi, bool IsFullTorus, int OccupiedBands)
{
    /// <summary>Nearest integer to the total flux over 2 pi (meaningful only on a full torus).</summary>
    public int ChernNumber => (int)Math.Round(TotalFluxOver2Pi);
}
