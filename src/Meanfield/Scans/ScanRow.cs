namespace Meanfield.Scans;

/// <summary>
/// One row of a scan output: where the point lies, the parameters it was solved with, and what the solver returned.
/// </summary>
/// <param name="PointId">Stable row-major point id.</param>
/// <param name="Shard">Index of the shard that computed the row.</param>
/// <param name="AxisValues">Axis values, aligned with the schema's axes.</param>
/// <param name="Parameters">Model parameter values used at the point (model energy unit or dimensionless).</param>
/// <param name="TemperatureK">Temperature in kelvin.</param>
/// <param name="Result">The solver's answer.</param>
/// <param name="WallSeconds">Wall-clock time spent on the point, s.</param>
/// <param name="WarmStarted">True when the stored result came from a warm-started solve.</param>
public sealed record ScanRow(
    int PointId,
    int Shard,
    IReadOnlyList<double> AxisValues,
    IReadOnlyList<KeyValuePair<string, double>> Parameters,
    double TemperatureK,
    ScanPointResult Result,
    double WallSeconds,
    bool WarmStarted)
{
    public double? Parameter(string name)
    {
        foreach (var kv in Parameters) if (kv.Key == name) return kv.Value;
        return null;
    }
}
