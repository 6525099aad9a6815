using System.Globalization;

namespace Meanfield.Scans;

/// <summary>How an axis spaces its points between its bounds.</summary>
public enum AxisSpacing { Linear, Log, Explicit }

/// <summary>
/// One axis of a scan: a model parameter, a free variable used by ties, or the temperature.
/// </summary>
/// <param name="Name">Axis name; a parameter name, a free variable, or "T"/"temperature".</param>
/// <param name="Values">Grid values in the axis's unit.</param>
/// <param name="Spacing">How the values were generated (for the grid description).</param>
/// <param name="IsFreeVariable">True when the name is not a model parameter and only feeds ties.</param>
/// <param name="KelvinPerUnit">For a temperature axis: kelvin per unit of the values (1 for K); else 0.</param>
/// <param name="Unit">Unit symbol of a temperature axis ("K", "meV", "eV"); empty otherwise.</param>
public sealed record ScanAxis(string Name, IReadOnlyList<double> Values, AxisSpacing Spacing = AxisSpacing.Explicit,
                              bool IsFreeVariable = false, double KelvinPerUnit = 0, string Unit = "")
{
    public int Count => Values.Count;

    /// <summary>True for the axis named T or temperature.</summary>
    public bool IsTemperature => IsTemperatureName(Name);

    public static bool IsTemperatureName(string name) =>
        name is "T" or "temperature";

    public static double[] Linear(double from, double to, int points)
    {
        var v = new double[points];
        for (int i = 0; i < points; i++) v[i] = points == 1 ? from : from + (to - from) * i / (points - 1);
        return v;
    }

    public static double[] Logarithmic(double from, double to, int points)
    {
        var v = new double[points];
        double a = Math.Log(from), b = Math.Log(to);
        for (int i = 0; i < points; i++) v[i] = points == 1 ? from : Math.Exp(a + (b - a) * i / (points - 1));
        return v;
    }

    public override string ToString() =>
        $"{Name}: {Count} points {Values[0].ToString("G6", CultureInfo.InvariantCulture)}.." +
        $"{Values[^1].ToString("G6", CultureInfo.InvariantCulture)} ({Spacing.ToString().ToLowerInvariant()})";
}
