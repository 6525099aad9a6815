using System.Numerics;
using System.Text.Json;
using Meanfield.Cli;
using Meanfield.Numerics;
using Meanfield.Output;
using Meanfield.Solutions;
using Meanfield.Tests.Cli;
using Parquet;

namespace Meanfield.Tests.Output;

/// <summary>
/// The exported one-body model and its way back. A lossless export reproduces H(k) exactly, so the reloaded model's
/// bands, nodes and mu must equal the solution's (common practice: a table of every matrix element, Fourier-summed
/// with the same phases, is the same Hamiltonian). The simple-cubic check is the textbook nearest-neighbour band
/// E(k) = eps - 2t (cos k_x a + cos k_y a + cos k_z a) (Ashcroft &amp; Mermin, Solid State Physics, 1976, eq. 10.17).
/// </summary>
public class OneBodyModelTests
{
    private static readonly Lazy<(string Dir, string Solution)> Weyl = new(() =>
    {
        var dir = CliRun.TempDir();
        var solution = Path.Combine(dir, "orv.json");
        var (code, stdout, err) = CliRun.Run("solve", CliRun.ModelPath("weyl-diamond.toml"), "--mesh", "10", "--out", solution);
        Assert.True(code == ExitCodes.Success, err + stdout);
        return (dir, solution);
    });

    [Theory]
    [InlineData("json")]
    [InlineData("csv")]
    [InlineData("parquet")]
    public void ExportedWeylSolutionReloadsWithTheSameBandsAndMu(string format)
    {
        var (dir, solutionPath) = Weyl.Value;
        var exported = Path.Combine(dir, $"orv-model.{format}");
        var (code, _, err) = CliRun.Run("export", solutionPath, "--out", exported);
        Assert.True(code == ExitCodes.Success, err);
        Assert.Equal(InputKind.ExportedModel, SolutionInput.Recognise(exported));

        var original = Solution.Load(solutionPath);
        var back = Solution.FromExport(OneBodyModelFiles.Load(exported));
        Assert.Empty(back.Model.Shells);
        Assert.Equal(original.Mu, back.Mu);
        Assert.Equal(original.Temperature, back.Temperature);
        Assert.Equal(original.Mesh!.N1, back.Mesh!.N1);

        int n = original.Hamiltonian.Size;
        Assert.Equal(n, back.Hamiltonian.Size);
        var h = new Complex[n * n]; var s = new Complex[n * n];
        var e1 = new double[n]; var e2 = new double[n];
        var eig = Eigensolvers.Create(n);
        var rng = new Random(11);
        for (int trial = 0; trial < 25; trial++)
        {
            var k = original.Model.Lattice.Cartesian(rng.NextDouble(), rng.NextDouble(), rng.NextDouble());
            original.Hamiltonian.Assemble(k, h, s);
            eig.Solve(h, e1, Span<Complex>.Empty);
            back.Hamiltonian.Assemble(k, h, s);
            eig.Solve(h, e2, Span<Complex>.Empty);
            for (int b = 0; b < n; b++) Assert.Equal(e1[b], e2[b], 1e-10);
        }
    }

    [Fact]
    public void ExportedWeylSolutionHasTheSameNodesChiralitiesAndMu()
    {
        var (dir, solutionPath) = Weyl.Value;
        var exported = Path.Combine(dir, "orv-nodes-model.csv");
        Assert.Equal(ExitCodes.Success, CliRun.Run("export", solutionPath, "--out", exported).Code);
        JsonDocument Nodes(string input, string name)
        {
            var outPath = Path.Combine(dir, name);
            var (code, stdout, err) = CliRun.Run("nodes", input, "--out", outPath);
            Assert.True(code == ExitCodes.Success, err + stdout);
            return JsonDocument.Parse(File.ReadAllText(outPath));
        }
        using var a = Nodes(solutionPath, "n-solution.json");
        using var b = Nodes(exported, "n-exported.json");
        Assert.Equal(a.RootElement.GetProperty("chemical_potential").GetDouble(), b.RootElement.GetProperty("chemical_potential").GetDouble());
        Assert.Equal(NodeReport.Totals(a).GetProperty("nodes").GetInt32(), NodeReport.Totals(b).GetProperty("nodes").GetInt32());
        Assert.True(NodeReport.Totals(a).GetProperty("nodes").GetInt32() >= 2);
        Assert.Equal(NodeReport.Totals(a).GetProperty("chirality_sum").GetInt32(), NodeReport.Totals(b).GetProperty("chirality_sum").GetInt32());
        static List<(double, double, double, int)> Signed(JsonDocument d) => [.. NodeReport.Members(d)
            .Select(m => (Math.Round(m.GetProperty("reduced")[0].GetDouble(), 6), Math.Round(m.GetProperty("reduced")[1].GetDouble(), 6),
                          Math.Round(m.GetProperty("reduced")[2].GetDouble(), 6), m.GetProperty("chirality").GetInt32()))
            .Order()];
        Assert.Equal(Signed(a), Signed(b));
        Assert.Equal(Path.GetFullPath(exported), b.RootElement.GetProperty("source").GetString());
        Assert.Contains("exported model", b.RootElement.GetProperty("source_kind").GetString());
    }

    [Fact]
    public void SimpleCubicBandFromAnExportedTableIsTheTextbookBand()
    {
        var dir = CliRun.TempDir();
        var table = Path.Combine(dir, "band.csv");
        File.Copy(Path.Combine(Meanfield.Tests.Models.ModelText.RepositoryRoot(), "tests", "Meanfield.Tests", "Corpus", "_base", "one-body.csv"), table);
        var model = OneBodyModelFiles.Load(table).Model;
        var ham = new Meanfield.Bloch.BlochHamiltonian(model);
        var h = new Complex[1]; var s = new Complex[1];
        const double t = 100, eps = 20, a = 4.1; // the table's amplitudes: -t to each neighbour, eps on site (meV, angstrom)
        var rng = new Random(3);
        for (int trial = 0; trial < 10; trial++)
        {
            var k = new Meanfield.Lattices.Vec3(rng.NextDouble(), rng.NextDouble(), rng.NextDouble()) * (Math.PI / a);
            ham.Assemble(k, h, s);
            Assert.Equal(eps - 2 * t * (Math.Cos(k.X * a) + Math.Cos(k.Y * a) + Math.Cos(k.Z * a)), h[0].Real, 1e-9);
            Assert.Equal(0, h[0].Imaginary, 1e-9);
        }
    }

    [Fact]
    public void ParquetColumnsCarryTheirUnitsInTheirOwnMetadataAndTheFiles()
    {
        var (dir, solutionPath) = Weyl.Value;
        var exported = Path.Combine(dir, "orv-meta.parquet");
        Assert.Equal(ExitCodes.Success, CliRun.Run("export", solutionPath, "--out", exported).Code);
        using var stream = File.OpenRead(exported);
        var reader = ParquetReader.CreateAsync(stream).GetAwaiter().GetResult();
        var meta = reader.CustomMetadata;
        Assert.Equal(OneBodyHeader.FormatTag, meta["format"]);
        Assert.Equal("true", meta["phase_includes_site_positions"]);
        Assert.Equal("meV", meta["unit.amplitude_real_meV"]);
        Assert.Equal("A:f correlated", meta["orbital_2"]);
        Assert.True(meta.ContainsKey("chemical_potential_meV"));
        using var rg = reader.OpenRowGroupReader(0);
        var field = reader.Schema.DataFields.Single(f => f.Name == "amplitude_imag_meV");
        Assert.Equal("meV", rg.GetCustomMetadata(field)["unit"]);
        var cell = reader.Schema.DataFields.Single(f => f.Name == "displacement_x_angstrom");
        Assert.Equal("angstrom", rg.GetCustomMetadata(cell)["unit"]);
        reader.DisposeAsync().AsTask().GetAwaiter().GetResult();
    }
}
