using System.Globalization;
using System.Reflection;

namespace Meanfield.Scans;

/// <summary>Key-value metadata stored in every scan Parquet file (chunks, shards and merged files).</summary>
public static class ScanMetadata
{
    public const string Units = "units";
    public const string ToolVersion = "tool_version";
    public const string ModelText = "model_text";
    public const string ModelSha256 = "model_sha256";
    public const string ScanText = "scan_text";
    public const string ScanSha256 = "scan_sha256";
    public const string CreatedUtc = "created_utc";
    public const string Grid = "grid";
    public const string Schema = "schema";
    public const string Shard = "shard";
    public const string EnergyUnit = "energy_unit";
    /// <summary>Present in merged files only: that they were merged, from how many shards of which run.</summary>
    public const string Merged = "merged";
    /// <summary>Present in merged files only: the shard files merged (absolute paths, one per line).</summary>
    public const string MergedFiles = "merged_files";

    public static string Version => Output.Provenance.ToolVersion;

    public static Dictionary<string, string> Build(ScanProvenance provenance, ScanGrid grid, ScanSchema schema, ShardSpec shard) => new()
    {
        [Units] = schema.UnitsJson(provenance.EnergyUnit),
        [ToolVersion] = "meanfield " + Version,
        [ModelText] = provenance.ModelText,
        [ModelSha256] = provenance.ModelSha256,
        [ScanText] = provenance.ScanText,
        [ScanSha256] = provenance.ScanSha256,
        [CreatedUtc] = DateTime.UtcNow.ToString("yyyy-MM-ddTHH:mm:ssZ", CultureInfo.InvariantCulture),
        [Grid] = grid.ToJson(),
        [Schema] = schema.ToJson(),
        [Shard] = shard.ToString(),
        [EnergyUnit] = provenance.EnergyUnit,
    };
}
