using System.Globalization;

namespace Meanfield.Lattices;

/// <summary>The outcome of reading a reduced wave vector: the vector, or why the text is not one.</summary>
/// <param name="Success">True when <paramref name="Vector"/> holds the value.</param>
/// <param name="Vector">The vector in reduced coordinates (units of the reciprocal basis).</param>
/// <param name="Error">What is wrong with the text (empty on success).</param>
public readonly record struct ReducedVectorParse(bool Success, Vec3 Vector, string Error);

/// <summary>
/// The one reader of reduced wave vectors given as text: three comma-separated finite numbers, "0,0,0.25" or
/// "0.5, 0.5, 0" (invariant culture). A two-dimensional lattice's vectors are written with a third component 0.
/// </summary>
public static class ReducedVectorText
{
    /// <summary>Reads <paramref name="text"/>; never throws.</summary>
    public static ReducedVectorParse Parse(string? text)
    {
        if (string.IsNullOrWhiteSpace(text)) return new(false, default, "empty: expected three comma-separated numbers such as 0,0,0.25");
        var c = text.Split(',', StringSplitOptions.TrimEntries);
        if (c.Length != 3) return new(false, default, $"'{text.Trim()}' has {c.Length} component(s): expected three comma-separated numbers such as 0,0,0.25");
        var x = new double[3];
        for (int j = 0; j < 3; j++)
            if (!double.TryParse(c[j], NumberStyles.Float, CultureInfo.InvariantCulture, out x[j]) || !double.IsFinite(x[j]))
                return new(false, default, $"component '{c[j]}' of '{text.Trim()}' is not a finite number");
        return new(true, new Vec3(x[0], x[1], x[2]), "");
    }
}
