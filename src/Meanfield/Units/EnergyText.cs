using System.Globalization;

namespace Meanfield.Units;

/// <summary>
/// An energy or temperature as written: a number and, optionally, its unit. A bare number (<see cref="Unit"/> null)
/// is in the energy unit of the model it applies to, everywhere it is accepted (model files, command-line options);
/// scan files, which are not tied to one model's unit, require the unit.
/// </summary>
/// <param name="Value">The number as written.</param>
/// <param name="Unit">The unit written after it, or null for a bare number.</param>
public readonly record struct EnergyQuantity(double Value, EnergyUnit? Unit)
{
    /// <summary>The value in <paramref name="modelUnit"/> (a bare number is taken to be in it already).</summary>
    public double In(EnergyUnit modelUnit) => Unit is { } u ? Value * u.Joules() / modelUnit.Joules() : Value;

    /// <summary>The value in kelvin, for a quantity that carries its unit; null for a bare number.</summary>
    public double? Kelvin => Unit is { } u ? Value * u.Kelvins() : null;
}

/// <summary>The outcome of <see cref="EnergyText.Parse"/>: the quantity, or why the text is not one.</summary>
/// <param name="Success">True when <see cref="Quantity"/> holds the value.</param>
/// <param name="Quantity">The parsed quantity (default on failure).</param>
/// <param name="Error">What is wrong, in words that fit after "'TEXT': " (empty on success).</param>
public readonly record struct EnergyParse(bool Success, EnergyQuantity Quantity, string Error);

/// <summary>
/// The one reader of energies and temperatures (k_B T) in meanfield: "2K", "2 K", "0.3meV", "1e-4 eV", or a bare
/// number. Units: K, meV, eV (case as written). Returns a result; never throws.
/// </summary>
public static class EnergyText
{
    /// <summary>Reads <paramref name="text"/>. A non-finite number, an unknown unit or extra words fail.</summary>
    public static EnergyParse Parse(string? text)
    {
        var t = (text ?? "").Trim();
        int split = t.Length;
        while (split > 0 && char.IsLetter(t[split - 1])) split--;
        var number = t[..split].Trim();
        var suffix = t[split..];
        if (number.Length == 0 || !double.TryParse(number, NumberStyles.Float, CultureInfo.InvariantCulture, out double value))
            return Fail("not a number with an optional unit, such as 2K, 0.3 meV or 1e-4 eV");
        if (!double.IsFinite(value)) return Fail("the number must be finite");
        if (suffix.Length == 0) return new(true, new(value, null), "");
        if (!EnergyUnits.TryParse(suffix, out var unit)) return Fail($"unknown unit '{suffix}' (use K, meV or eV)");
        return new(true, new(value, unit), "");

        static EnergyParse Fail(string why) => new(false, default, why);
    }
}
