using System.Globalization;
using System.Text;
using Meanfield.Analysis.Dos;
using Meanfield.Units;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output;

/// <summary>
/// Writes a <see cref="DensityOfStates"/> as one row per energy, CSV or Parquet by extension. Columns: energy and
/// energy_minus_mu (model energy unit), total, conduction, correlated, site_NAME... (states per cell per energy unit,
/// all flavours), integrated (states per cell below the energy). Units and provenance go into the CSV's leading '#'
/// line or the Parquet key-value metadata. Written atomically.
/// </summary>
public static class DosTableWriter
{
    public static IReadOnlyList<string> Columns(DensityOfStates dos) =>
        ["energy", "energy_minus_mu", "total", "conduction", "correlated", .. dos.SiteNames.Select(s => "site_" + s), "integrated"];

    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(DensityOfStates dos, double mu, EnergyUnit unit, string path, IReadOnlyDictionary<string, string>? metadata = null)
    {
        var ext = Path.GetExtension(path).ToLowerInvariant();
        var meta = new Dictionary<string, string>
        {
            ["energy_unit"] = unit.Symbol(),
            ["dos_unit"] = $"states per cell per {unit.Symbol()}",
            ["chemical_potential"] = mu.ToString("R", CultureInfo.InvariantCulture),
            ["method"] = dos.Method,
        };
        if (metadata != null) foreach (var (k, v) in metadata) meta[k] = v;
        var task = ext switch
        {
            ".csv" => AtomicFile.WriteAsync(path, s => WriteCsv(dos, mu, s, meta)),
            ".parquet" => AtomicFile.WriteAsync(path, s => WriteParquet(dos, mu, s, meta)),
            _ => throw new ArgumentException($"DOS table '{path}': unknown extension '{ext}'; use .csv or .parquet."),
        };
        task.GetAwaiter().GetResult();
    }

    private static double[][] Data(DensityOfStates d, double mu) =>
        [d.Energies, [.. d.Energies.Select(e => e - mu)], d.Total, d.Conduction, d.Correlated, .. d.BySite, d.Integrated];

    private static async Task WriteCsv(DensityOfStates dos, double mu, Stream stream, Dictionary<string, string> meta)
    {
        var inv = CultureInfo.InvariantCulture;
        await using var w = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16);
        w.WriteLine("# density of states; " + string.Join("; ", meta.Select(kv => $"{kv.Key}={kv.Value.Replace('\n', ' ')}")));
        w.WriteLine(string.Join(",", Columns(dos)));
        var cols = Data(dos, mu);
        var sb = new StringBuilder();
        for (int i = 0; i < dos.Energies.Length; i++)
        {
            sb.Clear();
            for (int c = 0; c < cols.Length; c++) { if (c > 0) sb.Append(','); sb.Append(cols[c][i].ToString("R", inv)); }
            w.WriteLine(sb);
        }
    }

    private static async Task WriteParquet(DensityOfStates dos, double mu, Stream stream, Dictionary<string, string> meta)
    {
        var fields = Columns(dos).Select(c => new DataField<double>(c)).ToArray();
        var schema = new ParquetSchema(fields);
        var cols = Data(dos, mu);
        await using var writer = await ParquetWriter.CreateAsync(schema, stream);
        writer.CustomMetadata = meta;
        using var rg = writer.CreateRowGroup();
        for (int c = 0; c < cols.Length; c++) await rg.WriteAsync<double>(fields[c], cols[c]);
    }
}
