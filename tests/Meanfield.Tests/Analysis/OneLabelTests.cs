using System.Globalization;
using System.Text.Json;
using Meanfield.Cli;
using Meanfield.Models;
using Meanfield.Scans;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Analysis;

/// <summary>
/// One solution, one label: `solve`, `nodes` and a scan row report the same phase, node count, chirality sum and mu for
/// every shipped model and for points of every shipped scan (common practice: two outputs of one quantity must agree).
/// </summary>
public class OneLabelTests
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    [Theory]
    [InlineData("kondo-insulator-sc.toml")]
    [InlineData("heavy-metal-cubic.toml")]
    [InlineData("weyl-diamond.toml")]
    [InlineData("honeycomb-2d.toml")]
    [InlineData("brelvanite.toml")]
    public void SolveAndNodesAgree(string file)
    {
        using var cli = new CliHarness();
        var json = cli.PathOf("s.json");
        Assert.Equal(ExitCodes.Success, cli.Run("solve", CliHarness.ShippedModel(file), "--mesh", "10", "--out", json));
        using var solution = JsonDocument.Parse(File.ReadAllText(json));
        var spectrum = solution.RootElement.GetProperty("spectrum");
        string phase = spectrum.GetProperty("phase").GetString()!;
        Assert.Contains($"phase        {phase}", cli.Out);
        var nodes = cli.PathOf("n.json");
        if (!spectrum.TryGetProperty("node_count", out var count))
        {
            Assert.Equal("heavy-metal", phase);
            Assert.Equal(ExitCodes.NoAnswer, cli.Run("nodes", json, "--out", nodes));
            return;
        }
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", json, "--out", nodes));
        using var report = JsonDocument.Parse(File.ReadAllText(nodes));
        Assert.Equal(phase, report.RootElement.GetProperty("phase").GetProperty("label").GetString());
        Assert.Equal(count.GetInt32(), NodeReport.Totals(report).GetProperty("nodes").GetInt32());
        Assert.Equal(solution.RootElement.GetProperty("mu").GetDouble(), report.RootElement.GetProperty("chemical_potential").GetDouble());
        if (spectrum.TryGetProperty("net_chirality", out var net))
            Assert.Equal(net.GetInt32(), NodeReport.Totals(report).GetProperty("chirality_sum").GetInt32());
    }

    [Theory]
    [InlineData("scans/weyl-diamond-v-ratio.toml", 13)]
    [InlineData("scans/cubic-kondo-t-v.toml", 7)]
    [InlineData("scans/brelvanite-u-ef.toml", 13)]
    public void ScanRowsAgreeWithSolve(string scanFile, int stride)
    {
        var path = Scans.RealSolverScanTests.RepoFile(scanFile);
        var scan = ScanFileReader.Load(path);
        var grid = scan.ToGrid();
        var solver = SaddlePointPointSolver.For(scan);
        var modelPath = Path.GetFullPath(scan.ModelPath);
        for (int id = 0; id < grid.Count; id += stride)
        {
            var point = grid.Point(id);
            var row = solver.Solve(point, null, CancellationToken.None);
            using var cli = new CliHarness();
            var json = cli.PathOf("s.json");
            var args = new List<string> { "solve", modelPath, "--mesh", scan.Solver.Mesh.ToString(Inv), "-T", point.TemperatureK.ToString("R", Inv) + "K", "--out", json };
            foreach (var kv in point.Overrides) { args.Add("--set"); args.Add($"{kv.Key}={kv.Value}"); }
            int code = cli.Run([.. args]);
            Assert.Equal(row.Converged ? ExitCodes.Success : ExitCodes.NotConverged, code);
            if (!row.Converged) continue;
            using var doc = JsonDocument.Parse(File.ReadAllText(json));
            var s = doc.RootElement.GetProperty("spectrum");
            Assert.Equal(s.GetProperty("phase").GetString(), row.Spectrum.Phase);
            // Inside a gap at T > 0, N(mu) is flat to exponential accuracy, so mu is fixed only loosely by N(mu) = N_e.
            double mu = doc.RootElement.GetProperty("mu").GetDouble();
            Assert.Equal(mu, row.Mu, 1e-6 * Math.Max(1, Math.Abs(mu)));
            Assert.Equal(s.TryGetProperty("node_count", out var c) ? c.GetInt32() : null, row.Spectrum.NodeCount);
            Assert.Equal(s.TryGetProperty("net_chirality", out var n) ? n.GetInt32() : null, row.Spectrum.NetChirality);
        }
    }
}
