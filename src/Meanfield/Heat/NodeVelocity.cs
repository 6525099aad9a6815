using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>An isotropic node velocity inferred from a T^3 heat-capacity coefficient, with its one-sigma uncertainty.</summary>
/// <param name="Nodes">Number of identical cones assumed.</param>
/// <param name="HbarV">hbar v* (energy unit x angstrom).</param>
/// <param name="HbarVError">One-sigma uncertainty of hbar v* (same unit).</param>
/// <param name="MetresPerSecond">v* in m/s.</param>
/// <param name="MetresPerSecondError">One-sigma uncertainty of v* (m/s).</param>
/// <param name="Unit">Energy unit of <paramref name="HbarV"/>.</param>
public sealed record NodeVelocity(int Nodes, double HbarV, double HbarVError, double MetresPerSecond,
                                  double MetresPerSecondError, EnergyUnit Unit);
