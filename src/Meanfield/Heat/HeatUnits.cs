using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>Conversions between per-cell quantities in units of k_B and molar quantities per mole of formula units.</summary>
public static class HeatUnits
{
    /// <summary>A heat capacity or entropy per cell in units of k_B, as J mol^-1 K^-1 per mole of formula units (times N_A k_B).</summary>
    public static double MolarFromPerCell(double perCellInKB, double formulaUnitsPerCell)
        => perCellInKB / formulaUnitsPerCell * PhysicalConstants.GasConstant;

    /// <summary>Temperature in kelvin expressed in a model energy unit (k_B = 1).</summary>
    public static double ToEnergy(double temperatureK, EnergyUnit unit) => temperatureK / unit.Kelvins();
}
