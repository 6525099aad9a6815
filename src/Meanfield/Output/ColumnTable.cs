using System.Globalization;
using System.Text;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output;

/// <summary>One column of a <see cref="ColumnTable"/>: its description and its values (double?[], double[], int[] or string[]).</summary>
public sealed record TableData(TableColumn Column, Array Values);

/// <summary>
/// The one writer of meanfield's result tables (bands, DOS, heat, curvature): CSV or Parquet by extension. CSV: a title
/// line, "# key = value" lines, "# column NAME [UNIT]: meaning" lines, the column names, the rows (RFC 4180 quoting; a
/// missing number is an empty cell). Parquet: the same pairs as key-value file metadata with `unit.NAME` and
/// `description.NAME` for every column, and `unit` and `description` in each numeric column's own metadata. Written
/// atomically.
/// </summary>
public static class ColumnTable
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Writes the table to <paramref name="path"/> (.csv or .parquet).</summary>
    /// <exception cref="ArgumentException">Another extension, or columns of different lengths.</exception>
    public static void Write(string path, string title, IReadOnlyList<KeyValuePair<string, string>> metadata, IReadOnlyList<TableData> columns)
    {
        if (columns.Select(c => c.Values.Length).Distinct().Count() > 1) throw new ArgumentException("table columns differ in length");
        // A key given twice keeps its first place and its last value.
        var order = new List<string>(); var values = new Dictionary<string, string>();
        foreach (var (k, v) in metadata) { if (!values.ContainsKey(k)) order.Add(k); values[k] = v; }
        metadata = [.. order.Select(k => new KeyValuePair<string, string>(k, values[k]))];
        // Standard output takes the text form.
        var ext = AtomicFile.IsStandardOutput(path) ? ".csv" : Path.GetExtension(path).ToLowerInvariant();
        var task = ext switch
        {
            ".csv" => AtomicFile.WriteAsync(path, s => WriteCsv(s, title, metadata, columns)),
            ".parquet" => AtomicFile.WriteAsync(path, s => WriteParquet(s, title, metadata, columns)),
            _ => throw new ArgumentException($"{path}: unknown extension '{ext}'; use .csv or .parquet"),
        };
        task.GetAwaiter().GetResult();
    }

    private static async Task WriteCsv(Stream stream, string title, IReadOnlyList<KeyValuePair<string, string>> metadata, IReadOnlyList<TableData> columns)
    {
        await using var w = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16);
        w.Write("# "); w.WriteLine(title.Replace('\n', ' '));
        foreach (var (k, v) in metadata) { w.Write("# "); w.Write(k); w.Write(" = "); w.WriteLine(v.Replace("\r", "").Replace("\n", "\\n")); }
        foreach (var c in columns) w.WriteLine($"# column {c.Column.Name} [{c.Column.Unit}]: {c.Column.Description}");
        w.WriteLine(string.Join(",", columns.Select(c => c.Column.Name)));
        int rows = columns.Count == 0 ? 0 : columns[0].Values.Length;
        var sb = new StringBuilder();
        for (int r = 0; r < rows; r++)
        {
            sb.Clear();
            for (int c = 0; c < columns.Count; c++)
            {
                if (c > 0) sb.Append(',');
                switch (columns[c].Values)
                {
                    case double[] d: if (double.IsFinite(d[r])) sb.Append(d[r].ToString("R", Inv)); break;
                    case double?[] d: if (d[r] is { } x && double.IsFinite(x)) sb.Append(x.ToString("R", Inv)); break;
                    case int[] i: sb.Append(i[r].ToString(Inv)); break;
                    case string[] s: sb.Append(Quote(s[r] ?? "")); break;
                }
            }
            w.WriteLine(sb);
        }
    }

    // RFC 4180 quoting: labels given as reduced coordinates contain commas.
    private static string Quote(string f) => f.IndexOfAny([',', '"', '\n', '\r']) < 0 ? f : "\"" + f.Replace("\"", "\"\"") + "\"";

    private static async Task WriteParquet(Stream stream, string title, IReadOnlyList<KeyValuePair<string, string>> metadata, IReadOnlyList<TableData> columns)
    {
        var fields = columns.Select(c => c.Values switch
        {
            double[] => (DataField)new DataField<double>(c.Column.Name),
            double?[] => new DataField<double?>(c.Column.Name),
            int[] => new DataField<int>(c.Column.Name),
            _ => new DataField<string>(c.Column.Name),
        }).ToArray();
        var schema = new ParquetSchema(fields);
        var meta = new Dictionary<string, string> { ["title"] = title };
        foreach (var (k, v) in metadata) meta[k] = v;
        TableColumn.AddUnits(meta, columns.Select(c => c.Column));
        await using var writer = await ParquetWriter.CreateAsync(schema, stream);
        writer.CustomMetadata = meta;
        using var rg = writer.CreateRowGroup();
        for (int c = 0; c < columns.Count; c++)
        {
            var own = columns[c].Column.Metadata();
            switch (columns[c].Values)
            {
                case double[] d: await rg.WriteAsync<double>(fields[c], d, null, own); break;
                case double?[] d: await rg.WriteAsync<double>(fields[c], d.Select(x => x is { } v && double.IsFinite(v) ? v : (double?)null).ToArray(), null, own); break;
                case int[] i: await rg.WriteAsync<int>(fields[c], i, null, own); break;
                case string[] s: await rg.WriteAsync(fields[c], s); break; // Parquet.Net 6: column metadata for value types only
            }
        }
    }
}
