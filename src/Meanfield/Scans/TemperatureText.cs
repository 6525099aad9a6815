using System.Globalization;
using Meanfield.Units;

namespace Meanfield.Scans;

/// <summary>Reads a temperature written as "2 K", "0.3 meV" or "1e-4 eV" (k_B T) into kelvin.</summary>
public static class TemperatureText
{
    public static bool TryParseKelvin(string text, out double kelvin, out string error)
    {
        kelvin = double.NaN;
        var parts = text.Trim().Split((char[]?)null, 2, StringSplitOptions.RemoveEmptyEntries);
        if (parts.Length != 2 || !double.TryParse(parts[0], NumberStyles.Float, CultureInfo.InvariantCulture, out double value))
        {
            error = $"'{text}' is not a temperature like \"2 K\" or \"0.3 meV\"";
            return false;
        }
        if (!KelvinPerUnit(parts[1], out double factor))
        {
            error = $"unknown temperature unit '{parts[1]}' (use K, meV or eV)";
            return false;
        }
        kelvin = value * factor;
        error = "";
        return true;
    }

    /// <summary>Kelvin per unit: 1 for K, e/k_B for eV, 1e-3 e/k_B for meV.</summary>
    public static bool KelvinPerUnit(string unit, out double factor)
    {
        factor = 0;
        if (!EnergyUnits.TryParse(unit, out var u)) return false;
        factor = u.Kelvins();
        return true;
    }
}
