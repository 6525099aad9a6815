using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using Meanfield.Scans;
using Parquet;

namespace Meanfield.Tests.Scans;

// The expected values are the closed-form functions of FakeSolver; the Parquet file is read back with Parquet.Net's
// own reader (not our ScanParquet) so a mismatch between writer and schema cannot hide.
public sealed class ScanRunnerTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-scanrun-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    private string Out(string name = "scan.parquet") => Path.Combine(_dir, name);

    // A point whose solve throws has no r, lambda, n_f, mu or free energy: the file holds nulls there, never NaN
    // (common practice: a missing value is missing, not a number), and the message in the error column.
    [Fact]
    public async Task A_failed_point_writes_nulls_and_its_error()
    {
        var grid = ScanTestData.Grid();
        var fake = new FakeSolver();
        ScanPointResult Solve(ScanPoint p, ScanPointResult? warm, CancellationToken ct) =>
            p.Id == 3 ? throw new InvalidOperationException("solver exploded at point 3") : fake.Solve(p, warm, ct);
        await ScanRunner.RunAsync(grid, Solve, new ScanOutput(Out(), ScanTestData.Provenance()), new ScanRunOptions(), null, CancellationToken.None);
        await using var stream = File.OpenRead(Out());
        await using var reader = await ParquetReader.CreateAsync(stream);
        using var group = reader.OpenRowGroupReader(0);
        var ids = new int[20]; var r = new double?[20]; var mu = new double?[20]; var error = new string[20];
        await group.ReadAsync<int>(reader.Schema.FindDataField("point_id"), ids);
        await group.ReadAsync<double>(reader.Schema.FindDataField("r_f"), r);
        await group.ReadAsync<double>(reader.Schema.FindDataField("mu"), mu);
        await group.ReadAsync(reader.Schema.FindDataField("error"), error);
        int row = Array.IndexOf(ids, 3);
        Assert.Null(r[row]);
        Assert.Null(mu[row]);
        Assert.Contains("solver exploded", error[row]);
        Assert.All(Enumerable.Range(0, 20).Where(i => i != row), i => Assert.True(r[i] is { } x && double.IsFinite(x)));
    }

    [Fact]
    public async Task Full_run_writes_schema_values_and_metadata()
    {
        var grid = ScanTestData.Grid();
        var fake = new FakeSolver();
        var reports = new List<ScanProgress>();
        var summary = await ScanRunner.RunAsync(grid, fake.Solve, new ScanOutput(Out(), ScanTestData.Provenance()),
            new ScanRunOptions { FlushEveryPoints = 3 }, new SyncProgress(reports.Add), CancellationToken.None);

        Assert.Equal(20, summary.Total);
        Assert.False(Directory.Exists(Out() + ".parts"));
        Assert.False(File.Exists(Out() + ".tmp"));
        Assert.Equal(20, reports[^1].Done);
        Assert.Equal(TimeSpan.Zero, reports[^1].Remaining);

        await using var stream = File.OpenRead(Out());
        await using var reader = await ParquetReader.CreateAsync(stream);
        var names = reader.Schema.DataFields.Select(f => f.Name).ToList();
        string[] expected =
        [
            "point_id", "shard", "axis_V", "axis_ratio", "param_V", "param_lso", "param_m", "temperature_K", "converged",
            "iterations", "residual_norm", "mu", "free_energy", "r_f", "lambda_f", "n_f_f", "direct_gap", "indirect_gap",
            "dos_fermi_total", "dos_fermi_correlated", "node_count", "pinned_nodes", "max_node_offset", "net_chirality", "abs_chirality",
            "gamma_mJ_per_mol_K2", "beta_mJ_per_mol_K4", "z2", "chern_number", "phase", "phase_reason", "error", "wall_seconds", "warm_started",
        ];
        Assert.Equal(expected, names);

        using var group = reader.OpenRowGroupReader(0);
        Assert.Equal(20, group.RowCount);
        var ids = new int[20]; var v = new double[20]; var ratio = new double[20]; var mu = new double?[20];
        var r = new double?[20]; var converged = new bool[20]; var gap = new double?[20]; var phase = new string[20];
        await group.ReadAsync<int>(reader.Schema.FindDataField("point_id"), ids);
        await group.ReadAsync<double>(reader.Schema.FindDataField("axis_V"), v);
        await group.ReadAsync<double>(reader.Schema.FindDataField("axis_ratio"), ratio);
        await group.ReadAsync<double>(reader.Schema.FindDataField("mu"), mu);
        await group.ReadAsync<double>(reader.Schema.FindDataField("r_f"), r);
        await group.ReadAsync<bool>(reader.Schema.FindDataField("converged"), converged);
        await group.ReadAsync<double>(reader.Schema.FindDataField("direct_gap"), gap);
        await group.ReadAsync(reader.Schema.FindDataField("phase"), phase);
        Assert.Equal(Enumerable.Range(0, 20), ids);
        for (int k = 0; k < 20; k++)
        {
            int i = k / 4, j = k % 4;
            Assert.Equal(50 + 62.5 * i, v[k], 12);
            Assert.Equal(0.1 + 0.4 / 3 * j, ratio[k], 12);
            Assert.Equal(FakeSolver.Mu(v[k], ratio[k]), mu[k]!.Value, 12);
            Assert.Equal(FakeSolver.R(v[k], ratio[k]), r[k]!.Value, 12);
            Assert.Equal((i + j) % 5 != 0, converged[k]);
            Assert.Equal(ratio[k] > 0.3 ? null : 2 * r[k], gap[k]);
            Assert.Equal(ratio[k] > 0.3 ? "weyl-semimetal" : "kondo-insulator", phase[k]);
        }
        Assert.Equal(4, converged.Count(c => !c)); // non-converged points are kept, not dropped

        var meta = reader.CustomMetadata;
        Assert.Equal(Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(ScanTestData.ModelText))), meta["model_sha256"]);
        Assert.Equal(ScanTestData.ModelText, meta["model_text"]);
        Assert.Equal(ScanTestData.ScanText, meta["scan_text"]);
        Assert.Equal("0/1", meta["shard"]);
        Assert.StartsWith("meanfield ", meta["tool_version"]);
        Assert.True(DateTime.TryParseExact(meta["created_utc"], "yyyy-MM-ddTHH:mm:ssZ", null,
            System.Globalization.DateTimeStyles.AdjustToUniversal, out var created));
        Assert.InRange(created, DateTime.UtcNow.AddMinutes(-5), DateTime.UtcNow.AddMinutes(1));
        var units = JsonSerializer.Deserialize<Dictionary<string, string>>(meta["units"])!;
        Assert.Equal("meV", units["mu"]);
        Assert.Equal("K", units["temperature_K"]);
        Assert.Equal(20, ScanGrid.FromJson(meta["grid"]).Count);
    }

    [Fact]
    public async Task Warm_start_is_the_previous_converged_neighbour_except_at_a_shard_start()
    {
        var grid = ScanTestData.Grid(6, 5);
        for (int shard = 0; shard < 3; shard++)
        {
            var fake = new FakeSolver();
            var results = new Dictionary<int, ScanPointResult>();
            PointSolver solver = (p, w, ct) => { var r = fake.Solve(p, w, ct); if (w is not null || !results.ContainsKey(p.Id)) results[p.Id] = r; return r; };
            await ScanRunner.RunAsync(grid, solver, new ScanOutput(Out($"w{shard}.parquet"), ScanTestData.Provenance()),
                new ScanRunOptions { Shard = new ShardSpec(shard, 3) }, null, CancellationToken.None);

            var order = grid.Shard(shard, 3);
            var firstCalls = fake.Calls.Where((c, k) => k == 0 || fake.Calls[k - 1].Id != c.Id).ToList();
            Assert.Equal(order, firstCalls.Select(c => c.Id));
            Assert.Null(firstCalls[0].Warm);
            ScanPointResult? lastGood = null;
            int failedWarm = 0;
            for (int k = 0; k < order.Count; k++)
            {
                if (k > 0)
                {
                    Assert.Same(lastGood, firstCalls[k].Warm);
                    if (lastGood is not null && !FakeSolver.Converges(grid.Point(order[k]))) failedWarm++;
                    var prev = grid.Point(order[k - 1]);
                    if (FakeSolver.Converges(prev)) Assert.Same(results[order[k - 1]], firstCalls[k].Warm);
                }
                if (FakeSolver.Converges(grid.Point(order[k]))) lastGood = results[order[k]];
            }
            // A warm-started solve that fails is retried cold once.
            Assert.Equal(order.Count + failedWarm, fake.Calls.Count);
        }
    }

    [Fact]
    public async Task Cancel_then_resume_gives_the_same_rows_as_an_uninterrupted_run()
    {
        var grid = ScanTestData.Grid(6, 5);
        await ScanRunner.RunAsync(grid, new FakeSolver().Solve, new ScanOutput(Out("full.parquet"), ScanTestData.Provenance()),
            new ScanRunOptions(), null, CancellationToken.None);
        var full = await ScanParquet.ReadAsync(Out("full.parquet"));

        using var cts = new CancellationTokenSource();
        var interrupted = new FakeSolver { OnCall = n => { if (n == 13) cts.Cancel(); } };
        var output = new ScanOutput(Out("resumed.parquet"), ScanTestData.Provenance());
        await Assert.ThrowsAnyAsync<OperationCanceledException>(() =>
            ScanRunner.RunAsync(grid, interrupted.Solve, output, new ScanRunOptions { FlushEveryPoints = 4 }, null, cts.Token));
        Assert.False(File.Exists(output.Path));
        Assert.True(output.HasChunks);
        var partial = new List<ScanRow>();
        foreach (var chunk in output.ChunkFiles()) partial.AddRange((await ScanParquet.ReadAsync(chunk)).Rows);
        Assert.InRange(partial.Count, 8, 12); // rows finished before the cancel reached disk

        // Without --resume an existing partial run is refused rather than overwritten.
        await Assert.ThrowsAsync<ScanError>(() =>
            ScanRunner.RunAsync(grid, new FakeSolver().Solve, output, new ScanRunOptions(), null, CancellationToken.None));

        var second = new FakeSolver();
        var summary = await ScanRunner.RunAsync(grid, second.Solve, output, new ScanRunOptions { Resume = true }, null, CancellationToken.None);
        Assert.Equal(partial.Count, summary.Resumed);
        Assert.DoesNotContain(second.Calls, c => partial.Any(p => p.PointId == c.Id));
        var resumed = await ScanParquet.ReadAsync(output.Path);
        Assert.Equal(full.Rows.Select(r => ScanTestData.Fingerprint(full, r)), resumed.Rows.Select(r => ScanTestData.Fingerprint(resumed, r)));
        Assert.False(Directory.Exists(output.PartsDirectory));
    }

    [Fact]
    public async Task Two_parallel_segments_cover_the_grid_once()
    {
        var grid = ScanTestData.Grid(6, 5);
        var fake = new FakeSolver();
        await ScanRunner.RunAsync(grid, fake.Solve, new ScanOutput(Out(), ScanTestData.Provenance()),
            new ScanRunOptions { DegreeOfParallelism = 2 }, null, CancellationToken.None);
        var table = await ScanParquet.ReadAsync(Out());
        Assert.Equal(Enumerable.Range(0, 30), table.Rows.Select(r => r.PointId));
        // Each half of the snake starts its own warm-start chain cold.
        var order = grid.Shard(0, 1);
        Assert.Null(fake.Calls.First(c => c.Id == order[0]).Warm);
        Assert.Null(fake.Calls.First(c => c.Id == order[15]).Warm);
        Assert.NotNull(fake.Calls.First(c => c.Id == order[17]).Warm);
    }

    /// <summary>Reports synchronously (Progress&lt;T&gt; posts to the thread pool and could arrive late).</summary>
    private sealed class SyncProgress(Action<ScanProgress> report) : IProgress<ScanProgress>
    {
        public void Report(ScanProgress value) { lock (this) report(value); }
    }
}
