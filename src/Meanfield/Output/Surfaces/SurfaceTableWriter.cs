using System.Globalization;
using System.Text;
using Meanfield.Analysis.Surfaces;
using Meanfield.Units;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output.Surfaces;

/// <summary>
/// Writes a <see cref="SurfaceReport"/> as a long table, CSV or Parquet by extension, through a temporary file.
/// Slab view: one row per (k-point, slab band): k_index, path_length, kx, ky, kz, label, band, energy,
/// energy_minus_mu, top_weight, bottom_weight. Spectrum view: one row per (k-point, energy): k_index, path_length,
/// kx, ky, kz, label, energy, energy_minus_mu, surface, bulk. Arcs view: one row per map point: i, j, s1, s2, kx, ky,
/// kz, surface, bulk. Units: energies in the model's unit, wave vectors in 1/angstrom, spectral functions in states
/// per energy unit per surface cell and principal layer. The CSV's leading '#' line and the Parquet key-value
/// metadata carry the units (key "column_units") and the facts of <see cref="SurfaceStudy.Facts"/>.
/// </summary>
public static class SurfaceTableWriter
{
    private sealed record Column(string Name, string Unit, Array Values);

    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(SurfaceReport report, string path, IReadOnlyDictionary<string, string>? metadata = null)
    {
        var ext = System.IO.Path.GetExtension(path).ToLowerInvariant();
        if (ext is not (".csv" or ".parquet")) throw new ArgumentException($"surface table '{path}': unknown extension '{ext}'; use .csv or .parquet");
        var columns = Columns(report);
        var facts = SurfaceStudy.Facts(report).ToList();
        if (metadata != null) facts.AddRange(metadata);
        facts.Add(new("column_units", string.Join(",", columns.Where(c => c.Unit != "").Select(c => $"{c.Name}={c.Unit}"))));
        if (ext == ".csv") AtomicFile.Write(path, s => WriteCsv(columns, facts, report, s));
        else AtomicFile.WriteAsync(path, s => WriteParquet(columns, facts, s)).GetAwaiter().GetResult();
    }

    private static List<Column> Columns(SurfaceReport r)
    {
        string e = r.Cut.Model.Unit.Symbol(), k = "1/angstrom", a = $"1/{e}";
        double mu = r.ChemicalPotential;
        if (r.Slab is { } s)
        {
            int nk = s.Path.Count, nb = s.Bands, rows = nk * nb;
            var cols = PathColumns(s.Path, nb, k);
            var band = new int[rows]; var en = new double[rows]; var rel = new double[rows]; var top = new double[rows]; var bottom = new double[rows];
            for (int i = 0, row = 0; i < nk; i++)
                for (int n = 0; n < nb; n++, row++)
                { band[row] = n; en[row] = s.Energy(i, n); rel[row] = en[row] - mu; top[row] = s.Top(i, n); bottom[row] = s.Bottom(i, n); }
            cols.AddRange([new("band", "", band), new("energy", e, en), new("energy_minus_mu", e, rel), new("top_weight", "", top), new("bottom_weight", "", bottom)]);
            return cols;
        }
        if (r.Spectrum is { } p)
        {
            int nk = p.Path.Count, ne = p.Energies.Length, rows = nk * ne;
            var cols = PathColumns(p.Path, ne, k);
            var en = new double[rows]; var rel = new double[rows]; var sf = new double[rows]; var bk = new double[rows];
            for (int i = 0, row = 0; i < nk; i++)
                for (int j = 0; j < ne; j++, row++)
                { en[row] = p.Energies[j]; rel[row] = en[row] - mu; sf[row] = p.Surface[i, j]; bk[row] = p.Bulk[i, j]; }
            cols.AddRange([new("energy", e, en), new("energy_minus_mu", e, rel), new("surface", a, sf), new("bulk", a, bk)]);
            return cols;
        }
        var m = r.Map!;
        int n1 = m.S1.Length, n2 = m.S2.Length, count = n1 * n2;
        var ii = new int[count]; var jj = new int[count]; var s1 = new double[count]; var s2 = new double[count];
        var kx = new double[count]; var ky = new double[count]; var kz = new double[count]; var su = new double[count]; var bu = new double[count];
        for (int i = 0, row = 0; i < n1; i++)
            for (int j = 0; j < n2; j++, row++)
            {
                var q = r.Cut.Zone.FromMap(m.S1[i], m.S2[j]);
                ii[row] = i; jj[row] = j; s1[row] = m.S1[i]; s2[row] = m.S2[j]; kx[row] = q.X; ky[row] = q.Y; kz[row] = q.Z;
                su[row] = m.Surface[i, j]; bu[row] = m.Bulk[i, j];
            }
        return [new("i", "", ii), new("j", "", jj), new("s1", k, s1), new("s2", k, s2), new("kx", k, kx), new("ky", k, ky), new("kz", k, kz),
                new("surface", a, su), new("bulk", a, bu)];
    }

    private static List<Column> PathColumns(Lattices.BandPathSample path, int repeat, string k)
    {
        int rows = path.Count * repeat;
        var idx = new int[rows]; var len = new double[rows]; var kx = new double[rows]; var ky = new double[rows]; var kz = new double[rows];
        var label = new string[rows];
        for (int i = 0, row = 0; i < path.Count; i++)
            for (int j = 0; j < repeat; j++, row++)
            { idx[row] = i; len[row] = path.Length[i]; kx[row] = path.K[i].X; ky[row] = path.K[i].Y; kz[row] = path.K[i].Z; label[row] = path.Labels[i]; }
        return [new("k_index", "", idx), new("path_length", k, len), new("kx", k, kx), new("ky", k, ky), new("kz", k, kz), new("label", "", label)];
    }

    private static void WriteCsv(List<Column> columns, List<KeyValuePair<string, string>> facts, SurfaceReport report, Stream stream)
    {
        var inv = CultureInfo.InvariantCulture;
        using var w = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16);
        w.Write($"# surface {report.Request.View.ToString().ToLowerInvariant()}");
        foreach (var (key, value) in facts) w.Write($"; {key}={value.Replace('\n', ' ').Replace(';', ',')}");
        w.WriteLine();
        w.WriteLine(string.Join(",", columns.Select(c => c.Name)));
        int rows = columns[0].Values.Length;
        var sb = new StringBuilder();
        for (int r = 0; r < rows; r++)
        {
            sb.Clear();
            for (int c = 0; c < columns.Count; c++)
            {
                if (c > 0) sb.Append(',');
                switch (columns[c].Values)
                {
                    case double[] d: sb.Append(d[r].ToString("R", inv)); break;
                    case int[] i: sb.Append(i[r].ToString(inv)); break;
                    case string[] s: sb.Append(Quote(s[r])); break;
                }
            }
            w.WriteLine(sb);
        }
    }

    // RFC 4180 quoting: labels given as reduced coordinates contain commas.
    private static string Quote(string f) => f.IndexOfAny([',', '"', '\n', '\r']) < 0 ? f : "\"" + f.Replace("\"", "\"\"") + "\"";

    private static async Task WriteParquet(List<Column> columns, List<KeyValuePair<string, string>> facts, Stream stream)
    {
        var fields = columns.Select(c => c.Values switch
        {
            double[] => (DataField)new DataField<double>(c.Name),
            int[] => new DataField<int>(c.Name),
            _ => new DataField<string>(c.Name),
        }).ToArray();
        var schema = new ParquetSchema(fields);
        var meta = new Dictionary<string, string>();
        foreach (var (key, value) in facts) meta[key] = meta.TryGetValue(key, out var old) ? old + " | " + value : value;
        await using var writer = await ParquetWriter.CreateAsync(schema, stream);
        writer.CustomMetadata = meta;
        using var rg = writer.CreateRowGroup();
        for (int c = 0; c < columns.Count; c++)
        {
            switch (columns[c].Values)
            {
                case double[] d: await rg.WriteAsync<double>(fields[c], d); break;
                case int[] i: await rg.WriteAsync<int>(fields[c], i); break;
                case string[] s: await rg.WriteAsync(fields[c], s); break;
            }
        }
    }
}
