using Meanfield.Models;
using Meanfield.Scans;
using Meanfield.Solver;
using Meanfield.Units;
using Parquet;

namespace Meanfield.Tests.Scans;

// Scans with the real saddle-point solver on the shipped simple-cubic Kondo-insulator model at small meshes.
public sealed class RealSolverScanTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-realscan-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    internal static string RepoFile(string relative)
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
            if (File.Exists(Path.Combine(d.FullName, relative))) return Path.Combine(d.FullName, relative);
        throw new FileNotFoundException($"{relative} not found above the test binaries");
    }

    internal static ScanDefinition Scan(string dir, string axes, int mesh, string extra = "")
    {
        string model = RepoFile("models/kondo-insulator-sc.toml").Replace("\\", "/");
        string path = Path.Combine(dir, "test-scan.toml");
        File.WriteAllText(path, $"model = \"{model}\"\n{axes}\n[solver]\nmesh = {mesh}\ntolerance = 1e-10\nmax_iterations = 200\n{extra}");
        return ScanFileReader.Load(path, ModelFile.Load(model).Parameters.Select(p => p.Name).ToList());
    }

    private const string TV3x3 = "[[axis]]\nname = \"T\"\nunit = \"K\"\nvalues = [5, 10, 20]\n[[axis]]\nname = \"V\"\nvalues = [150, 175, 200]\n";

    [Fact]
    public async Task Tiny_real_scan_writes_converged_Kondo_insulator_rows_read_back_by_ParquetNet()
    {
        var scan = Scan(_dir, TV3x3, mesh: 6);
        var file = Path.Combine(_dir, "tv.parquet");
        var summary = await ScanRunner.RunAsync(scan.ToGrid(), SaddlePointPointSolver.For(scan).Delegate,
            new ScanOutput(file, scan.Provenance()), new ScanRunOptions(), null, CancellationToken.None);
        Assert.Equal(9, summary.Total);
        Assert.Equal(0, summary.NonConverged);

        await using var stream = File.OpenRead(file);
        await using var reader = await ParquetReader.CreateAsync(stream);
        using var group = reader.OpenRowGroupReader(0);
        var converged = new bool[9]; var phase = new string[9]; var r = new double?[9]; var v = new double?[9]; var gap = new double?[9];
        await group.ReadAsync<bool>(reader.Schema.FindDataField("converged"), converged);
        await group.ReadAsync(reader.Schema.FindDataField("phase"), phase);
        await group.ReadAsync<double>(reader.Schema.FindDataField("r_Va"), r);
        await group.ReadAsync<double>(reader.Schema.FindDataField("param_V"), v);
        await group.ReadAsync<double>(reader.Schema.FindDataField("direct_gap"), gap);
        for (int i = 0; i < 9; i++)
        {
            Assert.True(converged[i]);
            // Two electrons per site fill the lower hybridized band: a Kondo insulator (Hewson, The Kondo Problem to Heavy Fermions (1993), ch. 7; common practice).
            // Without spin-orbit coupling the bands are two spin copies, so every Z2 index vanishes (common practice).
            Assert.Equal("trivial-kondo-insulator", phase[i]);
            Assert.InRange(r[i]!.Value, 1e-3, 1);
            // Hybridized bands E = (e + ef~)/2 -+ sqrt(((e - ef~)/2)^2 + (rV)^2) (Hewson, The Kondo Problem to Heavy
            // Fermions (1993), ch. 7): the direct gap sqrt((e - ef~)^2 + 4 r^2 V^2) is at least 2 r V.
            Assert.True(gap[i] >= 2 * r[i]!.Value * v[i]!.Value * (1 - 1e-9), $"direct gap {gap[i]} < 2rV = {2 * r[i]!.Value * v[i]!.Value}");
            Assert.True(gap[i] < 2 * r[i]!.Value * v[i]!.Value * 1.5, $"direct gap {gap[i]} far above 2rV = {2 * r[i]!.Value * v[i]!.Value}");
        }
    }

    [Fact]
    public async Task T_V_boundary_matches_the_mean_field_Kondo_temperature_within_one_grid_step()
    {
        // Above T_K^MF only the decoupled (r = 0) solution exists (Read & Newns 1983; Hewson ch. 7): along T at fixed V
        // the scan's last coherent and first decoupled temperatures must bracket T_K^MF found by continuation.
        var temperatures = Enumerable.Range(0, 12).Select(i => 20 * Math.Pow(2, i / 2.0)).ToArray(); // 20 K .. 905 K
        string axes = "[[axis]]\nname = \"V\"\nvalues = [150, 180]\n[[axis]]\nname = \"T\"\nunit = \"K\"\nvalues = ["
                      + string.Join(", ", temperatures.Select(t => t.ToString("R", System.Globalization.CultureInfo.InvariantCulture))) + "]\n";
        var scan = Scan(_dir, axes, mesh: 6);
        var file = Path.Combine(_dir, "b.parquet");
        await ScanRunner.RunAsync(scan.ToGrid(), SaddlePointPointSolver.For(scan).Delegate, new ScanOutput(file, scan.Provenance()),
                                  new ScanRunOptions(), null, CancellationToken.None);
        var rows = (await ScanParquet.ReadAsync(file)).Rows;
        var spec = ModelFile.Load(RepoFile("models/kondo-insulator-sc.toml"));
        foreach (double v in new[] { 150.0, 180.0 })
        {
            var line = rows.Where(r => r.AxisValues[0] == v).OrderBy(r => r.TemperatureK).ToList();
            Assert.All(line, r => Assert.True(r.Result.Converged));
            bool Coherent(ScanRow r) => r.Result.Groups[0].R > 1e-4;
            int first = line.FindIndex(r => !Coherent(r));
            Assert.True(first > 0, $"V = {v}: no boundary inside the temperature grid");
            Assert.All(line.Skip(first), r => Assert.False(Coherent(r)));

            var model = ModelBinder.Bind(spec, new Dictionary<string, string> { ["V"] = v.ToString(System.Globalization.CultureInfo.InvariantCulture) });
            double kelvin = model.Unit.Kelvins();
            var settings = new SolverSettings { Mesh = 6, Tolerance = 1e-10, MaxIterations = 200 };
            var tk = KondoTemperature.Find((t, guess) => new SaddlePointSolver(model, settings with { Temperature = t, InitialGuess = guess }).Solve(),
                                           10 / kelvin, relativeTolerance: 1e-3);
            Assert.NotNull(tk.Temperature);
            double tkK = tk.Temperature!.Value * kelvin;
            Assert.InRange(tkK, line[first - 1].TemperatureK * 0.999, line[first].TemperatureK * 1.001);
        }
    }

    [Fact]
    public async Task Warm_starts_need_fewer_iterations_than_cold_starts()
    {
        // Common practice: continuation from a neighbouring solution converges in fewer Newton/Broyden steps.
        string axes = "temperature = \"10 K\"\n[[axis]]\nname = \"V\"\nfrom = 150\nto = 200\npoints = 6\n";
        var scan = Scan(_dir, axes, mesh: 6);
        var grid = scan.ToGrid();
        var warm = SaddlePointPointSolver.For(scan);
        var cold = new SaddlePointPointSolver(ModelFile.Parse(scan.ModelText, scan.ModelPath), scan.Solver, scan.Columns) { ColdOnly = true };
        await ScanRunner.RunAsync(grid, warm.Delegate, new ScanOutput(Path.Combine(_dir, "w.parquet"), scan.Provenance()),
                                  new ScanRunOptions { RetryColdOnFailure = false }, null, CancellationToken.None);
        await ScanRunner.RunAsync(grid, cold.Delegate, new ScanOutput(Path.Combine(_dir, "c.parquet"), scan.Provenance()),
                                  new ScanRunOptions { RetryColdOnFailure = false }, null, CancellationToken.None);
        var w = (await ScanParquet.ReadAsync(Path.Combine(_dir, "w.parquet"))).Rows;
        var c = (await ScanParquet.ReadAsync(Path.Combine(_dir, "c.parquet"))).Rows;
        Assert.All(w.Concat(c), r => Assert.True(r.Result.Converged));
        Assert.True(w.Average(r => r.Result.Iterations) < c.Average(r => r.Result.Iterations),
            $"warm {w.Average(r => r.Result.Iterations)} vs cold {c.Average(r => r.Result.Iterations)}");
        Assert.True(warm.ZonePasses < cold.ZonePasses, $"zone passes warm {warm.ZonePasses} vs cold {cold.ZonePasses}");
        for (int i = 0; i < w.Count; i++) Assert.Equal(c[i].Result.Groups[0].R, w[i].Result.Groups[0].R, 6);
    }
}
