namespace Meanfield.Scans;

/// <summary>The content of one scan Parquet file: schema, rows and key-value metadata.</summary>
public sealed record ScanTable(string Path, ScanSchema Schema, IReadOnlyList<ScanRow> Rows, IReadOnlyDictionary<string, string> Metadata)
{
    public ScanGrid Grid => ScanGrid.FromJson(Metadata[ScanMetadata.Grid]);
    public string? ScanSha256 => Metadata.GetValueOrDefault(ScanMetadata.ScanSha256);
    public string? ModelSha256 => Metadata.GetValueOrDefault(ScanMetadata.ModelSha256);
}
