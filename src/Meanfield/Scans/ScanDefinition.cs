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

    public ScanGrid ToGrid() => new(Axes, Fixed, Ties, TemperatureK);

    public ScanProvenance Provenance(string energyUnit = "meV") => new(ModelText, SourceText, energyUnit);
}
