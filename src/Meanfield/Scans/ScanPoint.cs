namespace Meanfield.Scans;

/// <summary>
/// One point of a scan grid, as handed to the solver.
/// </summary>
/// <param name="Id">Stable point id: the flat row-major index over the axes (last axis fastest), independent of the
/// order in which points are visited.</param>
/// <param name="Index">Index along each axis.</param>
/// <param name="AxisNames">Axis names, in scan-file order.</param>
/// <param name="AxisValues">Axis values, in the axis's own unit (a temperature axis in K or its declared energy unit).</param>
/// <param name="Overrides">Model parameter overrides in evaluation order: fixed values, then axis values of parameter
/// axes, then ties. Values are expression strings: a plain number ("20"), or a tie whose free-variable axes are already
/// substituted ("(0.35) * lso"). The model binder evaluates them; names that are free variables never appear here.</param>
/// <param name="TemperatureK">Temperature in kelvin.</param>
public sealed record ScanPoint(
    int Id,
    IReadOnlyList<int> Index,
    IReadOnlyList<string> AxisNames,
    IReadOnlyList<double> AxisValues,
    IReadOnlyList<KeyValuePair<string, string>> Overrides,
    double TemperatureK)
{
    /// <summary>"point 17 (V = 300, ratio = 0.5)": the point in messages.</summary>
    public string Label => $"point {Id} ({string.Join(", ", AxisNames.Select((n, i) => string.Create(System.Globalization.CultureInfo.InvariantCulture, $"{n} = {AxisValues[i]:G8}")))})";

    /// <summary>Value of the named axis at this point.</summary>
    public double Axis(string name)
    {
        for (int i = 0; i < AxisNames.Count; i++) if (AxisNames[i] == name) return AxisValues[i];
        throw new KeyNotFoundException($"scan has no axis '{name}'");
    }

    /// <summary>The override expression for a parameter, or null when the scan leaves it at the model's value.</summary>
    public string? Override(string name)
    {
        foreach (var kv in Overrides) if (kv.Key == name) return kv.Value;
        return null;
    }
}
