using System.Globalization;
using Meanfield.Units;

namespace Meanfield.Scans;

/// <summary>Reads a scan file's temperature, "2 K", "2K", "0.3 meV" or "1e-4 eV" (k_B T), into kelvin.</summary>
public static class TemperatureText
{
    /// <summary>
    /// A scan file's temperature: <see cref="EnergyText"/> with the unit required (a scan file is not tied to one
    /// model's energy unit, so a bare number would be ambiguous).
    /// </summary>
    public static bool TryParseKelvin(string text, out double kelvin, out string error)
    {
        kelvin = double.NaN;
        var parsed = EnergyText.Parse(text);
        if (!parsed.Success) { error = $"'{text}': {parsed.Error}"; return false; }
        if (parsed.Quantity.Kelvin is not { } k) { error = $"'{text}': give the unit, for example \"{text.Trim()} K\" (a scan file is not tied to one model's energy unit)"; return false; }
        kelvin = k;
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
