using System.Globalization;
using System.Text;
using Meanfield.Analysis.Bands;
using Meanfield.Units;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output;

/// <summary>
/// Writes a <see cref="BandStructure"/> as a long table, one row per (k-point, band), in CSV or Parquet chosen by the
/// file extension. Columns: k_index, path_length (1/angstrom), kx, ky, kz (1/angstrom), label (path vertex label, empty
/// elsewhere; "G" is the zone centre), band (0 = lowest), energy (model energy unit), f_weight (correlated-orbital
/// weight, 0..1). The energy unit is named in the CSV's leading '#' comment line and in the Parquet key-value metadata
/// under "energy_unit". Output is written to a temporary file and renamed into place.
/// </summary>
public static class BandTableWriter
{
    public static readonly string[] Columns = ["k_index", "path_length", "kx", "ky", "kz", "label", "band", "energy", "f_weight"];

    /// <summary>Parquet key-value metadata key naming the energy unit ("meV", "eV" or "K").</summary>
    public const string EnergyUnitKey = "energy_unit";
    /// <summary>Parquet key-value metadata key naming the unit of path_length, kx, ky, kz.</summary>
    public const string LengthUnitKey = "k_unit";

    /// <summary>Writes <paramref name="bands"/> to <paramref name="path"/> (.csv or .parquet); extra metadata goes into the header/key-value store.</summary>
    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(BandStructure bands, string path, IReadOnlyDictionary<string, string>? metadata = null) =>
        WriteAsync(bands, path, metadata).GetAwaiter().GetResult();

    public static Task WriteAsync(BandStructure bands, string path, IReadOnlyDictionary<string, string>? metadata = null)
    {
        var ext = Path.GetExtension(path).ToLowerInvariant();
        return ext switch
        {
            ".csv" => AtomicFile.WriteAsync(path, s => WriteCsv(bands, s, metadata)),
            ".parquet" => AtomicFile.WriteAsync(path, s => WriteParquet(bands, s, metadata)),
            _ => throw new ArgumentException($"Band table '{path}': unknown extension '{ext}'; use .csv or .parquet."),
        };
    }

    private static async Task WriteCsv(BandStructure b, Stream stream, IReadOnlyDictionary<string, string>? metadata)
    {
        var inv = CultureInfo.InvariantCulture;
        await using var w = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16);
        w.Write($"# band structure along {string.Join(" ", b.Path.Ticks.Select(t => t.Label))}; energy in {b.Unit.Symbol()}; path_length, kx, ky, kz in 1/angstrom; f_weight = correlated-orbital weight");
        if (metadata != null) foreach (var (key, value) in metadata) w.Write($"; {key}={value.Replace('\n', ' ')}");
        w.WriteLine();
        w.WriteLine(string.Join(",", Columns));
        for (int k = 0; k < b.KCount; k++)
        {
            var q = b.Path.K[k];
            string prefix = string.Create(inv, $"{k},{b.Path.Length[k]:R},{q.X:R},{q.Y:R},{q.Z:R},{Csv(b.Path.Labels[k])}");
            for (int n = 0; n < b.BandCount; n++)
                w.WriteLine(string.Create(inv, $"{prefix},{n},{b.Energy(k, n):R},{b.CorrelatedWeight(k, n):R}"));
        }
    }

    // RFC 4180 quoting: labels given as reduced coordinates contain commas.
    private static string Csv(string field) =>
        field.IndexOfAny([',', '"', '\n', '\r']) < 0 ? field : "\"" + field.Replace("\"", "\"\"") + "\"";

    /// <summary>The Parquet schema of the table.</summary>
    public static ParquetSchema Schema() => new(
        new DataField<int>("k_index"), new DataField<double>("path_length"),
        new DataField<double>("kx"), new DataField<double>("ky"), new DataField<double>("kz"),
        new DataField<string>("label"), new DataField<int>("band"),
        new DataField<double>("energy"), new DataField<double>("f_weight"));

    private static async Task WriteParquet(BandStructure b, Stream stream, IReadOnlyDictionary<string, string>? metadata)
    {
        int nk = b.KCount, nb = b.BandCount, rows = nk * nb;
        var kIndex = new int[rows]; var band = new int[rows];
        var len = new double[rows]; var kx = new double[rows]; var ky = new double[rows]; var kz = new double[rows];
        var label = new string[rows]; var energy = new double[rows]; var fw = new double[rows];
        for (int k = 0, r = 0; k < nk; k++)
            for (int n = 0; n < nb; n++, r++)
            {
                var q = b.Path.K[k];
                kIndex[r] = k; len[r] = b.Path.Length[k]; kx[r] = q.X; ky[r] = q.Y; kz[r] = q.Z;
                label[r] = b.Path.Labels[k]; band[r] = n; energy[r] = b.Energy(k, n); fw[r] = b.CorrelatedWeight(k, n);
            }
        var schema = Schema();
        var f = schema.DataFields;
        var meta = new Dictionary<string, string>
        {
            [EnergyUnitKey] = b.Unit.Symbol(),
            [LengthUnitKey] = "1/angstrom",
            ["band_path"] = string.Join(" ", b.Path.Ticks.Select(t => t.Label)),
        };
        if (metadata != null) foreach (var (key, value) in metadata) meta[key] = value;
        await using var writer = await ParquetWriter.CreateAsync(schema, stream);
        writer.CustomMetadata = meta;
        using var rg = writer.CreateRowGroup();
        await rg.WriteAsync<int>(f[0], kIndex);
        await rg.WriteAsync<double>(f[1], len);
        await rg.WriteAsync<double>(f[2], kx);
        await rg.WriteAsync<double>(f[3], ky);
        await rg.WriteAsync<double>(f[4], kz);
        await rg.WriteAsync(f[5], label);
        await rg.WriteAsync<int>(f[6], band);
        await rg.WriteAsync<double>(f[7], energy);
        await rg.WriteAsync<double>(f[8], fw);
    }
}
