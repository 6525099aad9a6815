namespace Meanfield.Scans;

/// <summary>A parsed, checked scan file.</summary>
public sealed record ScanDefinition
{
    /// <summary>Absolute path of the scan file.</summary>
    public required string SourcePath { get; init; }
    public required string SourceText { get; init; }
    /// <summary>Absolute path of the model file (resolved relative to the scan file).</summary>
    public required string ModelPath { get; init; }
    public required string ModelText { get; init; }
    public required IReadOnlyList<ScanAxis> Axes { get; init; }
    public IReadOnlyList<KeyValuePair<string, string>> Ties { get; init; } = [];
    public IReadOnlyList<KeyValuePair<string, string>> Fixed { get; init; } = [];
    /// <summary>Temperature in K when no axis scans it.</summary>
    public double? TemperatureK { get; init; }
    public ScanSolverSettings Solver { get; init; } = new();
    public ScanColumnRequest Columns { get; init; } = new();
    /// <summary>1-based line of each override source: "axis.NAME" (its [[axis]] table), "fixed.NAME", "tie.NAME".</summary>
    public IReadOnlyDictionary<string, int> Lines { get; init; } = new Dictionary<string, int>();

    /// <summary>
    /// Where the value of parameter <paramref name="name"/> comes from in the scan file: the field ("tie.m",
    /// "fixed.t", "axis.V") and its line (0 when unknown); null when the scan does not set it.
    /// </summary>
    public (string Field, int Line)? Source(string name)
    {
        foreach (var table in new[] { "tie", "fixed", "axis" })
            if (Lines.TryGetValue($"{table}.{name}", out int line)) return ($"{table}.{name}", line);
        return null;
    }

    public ScanGrid ToGrid() => new(Axes, Fixed, Ties, TemperatureK);

    public ScanProvenance Provenance(string energyUnit = "meV") => new(ModelText, SourceText, energyUnit);
}
