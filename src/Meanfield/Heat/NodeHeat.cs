using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>
/// Heat capacity of linear band-touching nodes (Weyl or Dirac cones) with mu at the node, per mole of formula units.
/// </summary>
/// <remarks>
/// Derivation. An isotropic cone E = +-hbar v |q| has the DOS per unit volume rho(E) = 4 pi q^2 (dq/dE) / (2 pi)^3
/// = E^2 / (2 pi^2 hbar^3 v^3) over both branches. With mu = 0 (fixed by particle-hole symmetry) the fixed-N correction
/// vanishes and C = (1/T^2) Int rho E^2 f(1-f) dE = T^3 / (2 pi^2 hbar^3 v^3) Int x^4 e^x/(e^x+1)^2 dx
/// = (7 pi^4/15) T^3 / (2 pi^2 hbar^3 v^3) = (7 pi^2/30) k_B^4 T^3 / (hbar^3 v^3) per node per unit volume
/// (k_B restored; the integral over the real line is 7 pi^4/15, Ashcroft &amp; Mermin, Solid State Physics (1976),
/// app. C). An anisotropic cone H = hbar q.v.sigma maps onto the isotropic one by q' = v q, so v^3 -> |det v_ij|.
/// A tilted cone H = E0 + v0.q + sum_ij q_i v_ij sigma_j is, with p = v^T q, E = E0 + w.p +- |p|, w = v^-1 v0. For
/// |w| &lt; 1 (type I) the upper cone below E0 + eps fills |p| &lt; eps / (1 + |w| cos theta), so it holds
/// (1/(2 pi)^3) Int dOmega eps^3 / (3 (1 + |w| cos theta)^3) = eps^3 / (6 pi^2 (1 - w^2)^2) states per p-volume
/// (Int dOmega (1 + w cos theta)^-3 = 4 pi / (1 - w^2)^2), the lower cone the same below E0 - eps: the DOS and the T^3
/// coefficient are those of the untilted cone times <see cref="TiltFactor"/> = 1 / (1 - w^2)^2 (derived and checked
/// numerically in the tests). For |w| &gt; 1 (type II) the node has electron and hole pockets and no T^3 law.
/// Velocities enter as hbar v in (energy unit x angstrom); the cell volume in angstrom^3.
/// </remarks>
/// <param name="Unit">Energy unit of hbar v; temperatures are kelvin.</param>
/// <param name="CellVolume">Volume of the cell holding the nodes (angstrom^3).</param>
/// <param name="FormulaUnitsPerCell">Formula units per cell.</param>
public sealed record NodeHeat(EnergyUnit Unit, double CellVolume, double FormulaUnitsPerCell = 1)
{
    /// <summary>7 pi^2 / 30: the per-node, per-volume prefactor of T^3 / (hbar v)^3 (k_B = 1).</summary>
    public static readonly double Prefactor = 7 * Math.PI * Math.PI / 30;

    /// <summary>
    /// 1 / (1 - w^2)^2: how much a tilt of ratio <paramref name="tiltRatio"/> = |v^-1 v0| (0 &lt;= w &lt; 1, type I)
    /// raises the DOS and the T^3 coefficient of a cone. <see cref="ArgumentException"/> for w &lt; 0, w &gt;= 1 (type II:
    /// no T^3 law) or NaN.
    /// </summary>
    public static double TiltFactor(double tiltRatio)
    {
        if (!(tiltRatio >= 0 && tiltRatio < 1))
            throw new ArgumentException($"tilt ratio {tiltRatio}: a T^3 law needs a type-I cone, 0 <= w < 1");
        double u = 1 - tiltRatio * tiltRatio;
        return 1 / (u * u);
    }

    /// <summary>
    /// The T^3 coefficient beta (J mol^-1 K^-4) of <paramref name="nodes"/> cones, each with
    /// |det(hbar v)| = <paramref name="velocityDeterminant"/> in (energy unit x angstrom)^3 and tilt ratio
    /// <paramref name="tiltRatio"/> (default 0, untilted; see <see cref="TiltFactor"/>).
    /// </summary>
    public double MolarBeta(double velocityDeterminant, int nodes = 1, double tiltRatio = 0)
    {
        if (!(velocityDeterminant > 0)) throw new ArgumentException("the velocity determinant must be positive");
        if (nodes < 1) throw new ArgumentException("at least one node is needed");
        double kelvinsPerUnit = Unit.Kelvins();
        double perCellPerUnitT3 = nodes * Prefactor * CellVolume / velocityDeterminant * TiltFactor(tiltRatio); // k_B per cell per (energy unit)^3
        return HeatUnits.MolarFromPerCell(perCellPerUnitT3, FormulaUnitsPerCell)
               / (kelvinsPerUnit * kelvinsPerUnit * kelvinsPerUnit);
    }

    /// <summary>C (J mol^-1 K^-1) at <paramref name="temperatureK"/> of identical cones.</summary>
    public double MolarHeat(double temperatureK, double velocityDeterminant, int nodes = 1)
        => MolarBeta(velocityDeterminant, nodes) * temperatureK * temperatureK * temperatureK;

    /// <summary>|det| of a 3x3 velocity tensor hbar v_ij (energy unit x angstrom), i.e. (energy unit x angstrom)^3.</summary>
    public static double Determinant(double[,] hbarV)
    {
        if (hbarV.GetLength(0) != 3 || hbarV.GetLength(1) != 3) throw new ArgumentException("the velocity tensor must be 3x3");
        double d = hbarV[0, 0] * (hbarV[1, 1] * hbarV[2, 2] - hbarV[1, 2] * hbarV[2, 1])
                 - hbarV[0, 1] * (hbarV[1, 0] * hbarV[2, 2] - hbarV[1, 2] * hbarV[2, 0])
                 + hbarV[0, 2] * (hbarV[1, 0] * hbarV[2, 1] - hbarV[1, 1] * hbarV[2, 0]);
        return Math.Abs(d);
    }

    /// <summary>
    /// The isotropic node velocity v* that gives the measured or fitted T^3 coefficient <paramref name="beta"/>
    /// (J mol^-1 K^-4, with one-sigma <paramref name="betaError"/>) from <paramref name="nodes"/> identical cones:
    /// (hbar v*)^3 = nodes (7 pi^2/30) k_B^4 V_cell N_A / (Z beta); sigma_v / v = sigma_beta / (3 beta).
    /// </summary>
    public NodeVelocity VelocityFromBeta(double beta, double betaError, int nodes)
    {
        if (!(beta > 0)) throw new ArgumentException($"beta = {beta} J mol^-1 K^-4: a node velocity needs a positive T^3 coefficient");
        double det = MolarBeta(1, nodes) / beta;
        double hbarV = Math.Cbrt(det);
        double metresPerSecond = hbarV * Unit.Joules() * 1e-10 / PhysicalConstants.HBar;
        double rel = Math.Abs(betaError) / (3 * beta);
        return new NodeVelocity(nodes, hbarV, hbarV * rel, metresPerSecond, metresPerSecond * rel, Unit);
    }
}
