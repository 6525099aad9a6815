using System.Globalization;
using System.Text;

namespace Meanfield.Scans;

/// <summary>A point that is missing from, or duplicated in, a set of shard files.</summary>
/// <param name="PointId">Row-major point id.</param>
/// <param name="AxisValues">Axis name to value at that point.</param>
/// <param name="Files">Files holding the point (empty when missing).</param>
public sealed record PointIssue(int PointId, IReadOnlyList<KeyValuePair<string, double>> AxisValues, IReadOnlyList<string> Files)
{
    public override string ToString() =>
        $"point {PointId} (" + string.Join(", ", AxisValues.Select(kv => $"{kv.Key} = {kv.Value.ToString("G6", CultureInfo.InvariantCulture)}")) + ")" +
        (Files.Count > 0 ? " in " + string.Join(", ", Files.Select(Path.GetFileName)) : "");
}

/// <summary>Outcome of a merge: what is missing or duplicated, and whether the merged file was written.</summary>
public sealed record ScanMergeReport(int GridPoints, int Rows, IReadOnlyList<PointIssue> Missing,
                                     IReadOnlyList<PointIssue> Duplicated, IReadOnlyList<string> MissingShards, bool Written)
{
    public bool Complete => Missing.Count == 0 && Duplicated.Count == 0;

    public override string ToString()
    {
        var sb = new StringBuilder();
        sb.Append(CultureInfo.InvariantCulture, $"{Rows} rows for {GridPoints} grid points");
        if (MissingShards.Count > 0) sb.Append("; missing shards: ").Append(string.Join(", ", MissingShards));
        if (Missing.Count > 0)
        {
            sb.Append(CultureInfo.InvariantCulture, $"; {Missing.Count} missing points:");
            foreach (var m in Missing.Take(20)) sb.Append("\n  ").Append(m);
            if (Missing.Count > 20) sb.Append(CultureInfo.InvariantCulture, $"\n  ... and {Missing.Count - 20} more");
        }
        if (Duplicated.Count > 0)
        {
            sb.Append(CultureInfo.InvariantCulture, $"; {Duplicated.Count} duplicated points:");
            foreach (var d in Duplicated.Take(20)) sb.Append("\n  ").Append(d);
        }
        sb.Append(Written ? "; merged file written" : "; nothing written");
        return sb.ToString();
    }
}
