using System.Globalization;
using Meanfield.Analysis.Bands;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Output;
using Meanfield.Tests.Analysis.Bands;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Tests.Output;

public sealed class BandTableWriterTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("bands-table-").FullName;
    public void Dispose() => Directory.Delete(_dir, recursive: true);

    // A two-band model with a correlated level, so f_weight varies between 0 and 1 along the path.
    private static BandStructure Bands() => BandStructure.Compute(
        new BlochHamiltonian(TightBindingModels.HybridizedCubic(4.0, 25, 12, 7)),
        BandPath.Default(Lattice.Create(LatticeKind.SimpleCubic, 4.0)).Sample(40));

    [Fact]
    public void CsvRoundTripKeepsEveryValueAndNamesTheUnit()
    {
        var b = Bands();
        var path = Path.Combine(_dir, "bands.csv");
        BandTableWriter.Write(b, path, new Dictionary<string, string> { ["model"] = "invented test model" }, mu: 5);
        var all = File.ReadAllLines(path);
        Assert.StartsWith("#", all[0]);
        Assert.Contains("# energy_unit = meV", all);
        Assert.Contains("# model = invented test model", all);
        Assert.Contains("# column energy_meV [meV]: band energy", all);
        var lines = all.SkipWhile(l => l.StartsWith('#')).ToArray();
        Assert.Equal(string.Join(",", BandTableWriter.Columns(b.Unit).Select(c => c.Name)), lines[0]);
        Assert.Equal(b.KCount * b.BandCount, lines.Length - 1);
        var inv = CultureInfo.InvariantCulture;
        for (int r = 0; r < b.KCount * b.BandCount; r++)
        {
            var f = lines[r + 1].Split(',');
            int k = int.Parse(f[0], inv), n = int.Parse(f[6], inv);
            Assert.Equal(r / b.BandCount, k);
            Assert.Equal(r % b.BandCount, n);
            Assert.Equal(b.Path.Length[k], double.Parse(f[1], inv));
            Assert.Equal(b.Path.K[k].X, double.Parse(f[2], inv));
            Assert.Equal(b.Path.K[k].Z, double.Parse(f[4], inv));
            Assert.Equal(b.Path.Labels[k], f[5]);
            Assert.Equal(b.Energy(k, n), double.Parse(f[7], inv));
            Assert.Equal(b.Energy(k, n) - 5, double.Parse(f[8], inv), 12);
            Assert.Equal(b.CorrelatedWeight(k, n), double.Parse(f[9], inv));
        }
        Assert.Equal("G", lines[1].Split(',')[5]);
        Assert.Single(Directory.GetFiles(_dir));   // the temporary file was renamed, not left behind
    }

    [Fact]
    public async Task ParquetRoundTripKeepsSchemaValuesAndUnitMetadata()
    {
        var b = Bands();
        var path = Path.Combine(_dir, "bands.parquet");
        BandTableWriter.Write(b, path);
        await using var reader = await ParquetReader.CreateAsync(path);
        Assert.Equal(BandTableWriter.Columns(b.Unit, withMu: false).Select(c => c.Name), reader.Schema.DataFields.Select(f => f.Name));
        Assert.Equal("meV", reader.CustomMetadata["energy_unit"]);
        Assert.Equal("1/angstrom", reader.CustomMetadata["unit.path_length_per_angstrom"]);
        Assert.Equal("meV", reader.CustomMetadata["unit.energy_meV"]);
        using var rg = reader.OpenRowGroupReader(0);
        Assert.Equal("meV", rg.GetCustomMetadata(reader.Schema.DataFields[7])["unit"]);
        Assert.Equal("1/angstrom", rg.GetCustomMetadata(reader.Schema.DataFields[2])["unit"]);
        int rows = b.KCount * b.BandCount;
        Assert.Equal(rows, rg.RowCount);
        var fields = reader.Schema.DataFields;
        var kIndex = new int[rows]; var band = new int[rows]; var energy = new double[rows]; var fw = new double[rows];
        var len = new double[rows]; var label = new string[rows];
        await rg.ReadAsync<int>(fields[0], kIndex);
        await rg.ReadAsync<double>(fields[1], len);
        await rg.ReadAsync(fields[5], label.AsMemory());
        await rg.ReadAsync<int>(fields[6], band);
        await rg.ReadAsync<double>(fields[7], energy);
        await rg.ReadAsync<double>(fields[8], fw);
        for (int r = 0; r < rows; r++)
        {
            Assert.Equal(r / b.BandCount, kIndex[r]);
            Assert.Equal(r % b.BandCount, band[r]);
            Assert.Equal(b.Path.Length[kIndex[r]], len[r]);
            Assert.Equal(b.Path.Labels[kIndex[r]], label[r] ?? "");
            Assert.Equal(b.Energy(kIndex[r], band[r]), energy[r]);
            Assert.Equal(b.CorrelatedWeight(kIndex[r], band[r]), fw[r]);
        }
        Assert.Contains(fw, w => w > 0.9);
        Assert.Contains(fw, w => w < 0.1);
    }

    [Fact]
    public void UnknownExtensionOrMissingFolderWritesNothing()
    {
        var b = Bands();
        var ex = Assert.Throws<ArgumentException>(() => BandTableWriter.Write(b, Path.Combine(_dir, "bands.xlsx")));
        Assert.Contains("bands.xlsx", ex.Message);
        Assert.Throws<DirectoryNotFoundException>(() => BandTableWriter.Write(b, Path.Combine(_dir, "no-such-folder", "bands.csv")));
        Assert.Empty(Directory.GetFileSystemEntries(_dir));
    }

    [Fact]
    public void ReducedCoordinateLabelsAreQuotedInCsv()
    {
        var lattice = Lattice.Create(LatticeKind.SimpleCubic, 4.0);
        var b = BandStructure.Compute(new BlochHamiltonian(TightBindingModels.SimpleCubic(4.0, 25)),
            BandPath.Parse("0,0,0 0.5,0.5,0", lattice).Sample(5));
        var path = Path.Combine(_dir, "coords.csv");
        BandTableWriter.Write(b, path);
        var lines = File.ReadAllLines(path).SkipWhile(l => l.StartsWith('#')).ToArray();
        Assert.EndsWith(",\"0,0,0\",0," + (-150.0).ToString("R", CultureInfo.InvariantCulture) + ",0", lines[1]);
    }
}
