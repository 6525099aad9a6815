namespace Meanfield.Heat;

/// <summary>
/// Quasiparticle thermodynamics at one temperature, at fixed electron count.
/// Per-cell quantities are in units of k_B (the DOS's energy unit doubles as temperature unit, k_B = 1);
/// molar quantities are per mole of formula units.
/// </summary>
/// <param name="TemperatureK">Temperature (K).</param>
/// <param name="ChemicalPotential">mu(T) solving Int rho f = N_e (DOS energy unit).</param>
/// <param name="ChemicalPotentialSlope">d mu / dT at fixed N_e (DOS energy unit per DOS energy unit, dimensionless).</param>
/// <param name="HeatCapacityPerCell">C per cell (k_B).</param>
/// <param name="EntropyPerCell">S per cell (k_B).</param>
/// <param name="MolarHeatCapacity">C in J mol^-1 K^-1.</param>
/// <param name="MolarEntropy">S in J mol^-1 K^-1.</param>
public sealed record ThermalPoint(double TemperatureK, double ChemicalPotential, double ChemicalPotentialSlope,
                                  double HeatCapacityPerCell, double EntropyPerCell,
                                  double MolarHeatCapacity, double MolarEntropy)
{
    /// <summary>C/T in mJ mol^-1 K^-2, the unit measured Sommerfeld coefficients are quoted in.</summary>
    public double MolarCOverTMilli => 1e3 * MolarHeatCapacity / TemperatureK;
}
