using System.Globalization;
using System.Text;

namespace Meanfield.Output;

/// <summary>
/// Writes a heat table as comma-separated text: '#' comment lines (units, provenance), a header row, then one row per
/// temperature; a missing value (null or NaN) is an empty cell. Written atomically: an error leaves no file.
/// </summary>
public static class HeatTableWriter
{
    public static void Write(string path, IEnumerable<string> comments, IReadOnlyList<string> columns,
                             IEnumerable<IReadOnlyList<double?>> rows)
    {
        var sb = new StringBuilder();
        foreach (var c in comments) sb.Append("# ").AppendLine(c);
        sb.AppendLine(string.Join(",", columns));
        foreach (var row in rows)
        {
            if (row.Count != columns.Count) throw new ArgumentException($"a row has {row.Count} values for {columns.Count} columns");
            sb.AppendLine(string.Join(",", row.Select(v => v is { } x && double.IsFinite(x) ? x.ToString("G10", CultureInfo.InvariantCulture) : "")));
        }
        AtomicFile.WriteText(path, sb.ToString());
    }
}
