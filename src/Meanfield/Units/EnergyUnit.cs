namespace Meanfield.Units;

/// <summary>The energy unit a model's numbers are written in. Temperatures use the same unit (k_B = 1).</summary>
public enum EnergyUnit { MilliElectronVolt, ElectronVolt, Kelvin }

public static class EnergyUnits
{
    /// <summary>Joules per one unit of energy.</summary>
    public static double Joules(this EnergyUnit unit) => unit switch
    {
        EnergyUnit.MilliElectronVolt => 1e-3 * PhysicalConstants.ElementaryCharge,
        EnergyUnit.ElectronVolt => PhysicalConstants.ElementaryCharge,
        EnergyUnit.Kelvin => PhysicalConstants.Boltzmann,
        _ => throw new ArgumentOutOfRangeException(nameof(unit)),
    };

    /// <summary>Kelvin per one unit of energy (T = E / k_B).</summary>
    public static double Kelvins(this EnergyUnit unit) => unit.Joules() / PhysicalConstants.Boltzmann;

    public static string Symbol(this EnergyUnit unit) => unit switch
    {
        EnergyUnit.MilliElectronVolt => "meV",
        EnergyUnit.ElectronVolt => "eV",
        EnergyUnit.Kelvin => "K",
        _ => "?",
    };

    public static bool TryParse(string text, out EnergyUnit unit)
    {
        switch (text.Trim())
        {
            case "meV": unit = EnergyUnit.MilliElectronVolt; return true;
            case "eV": unit = EnergyUnit.ElectronVolt; return true;
            case "K": unit = EnergyUnit.Kelvin; return true;
            default: unit = EnergyUnit.MilliElectronVolt; return false;
        }
    }
}
