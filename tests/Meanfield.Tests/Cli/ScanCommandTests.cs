using System.Collections;
using System.CommandLine;
using Meanfield.Cli;
using Meanfield.Cli.Commands;
using Meanfield.Scans;
using Meanfield.Tests.Scans;

namespace Meanfield.Tests.Cli;

public sealed class ScanCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-scancli-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    private static (int Code, string Out, string Err) Run(ScanCommandContext context, params string[] args)
    {
        var o = new StringWriter(); var e = new StringWriter();
        int code = Runner.Run(new RootCommand { ScanCommand.Build(context) }, args, o, e);
        return (code, o.ToString(), e.ToString());
    }

    private static ScanCommandContext NoSlurm(CancellationToken ct = default, Action<ScanProgress>? hook = null) =>
        new(() => new Hashtable(), ct, hook);

    private string ScanFile()
    {
        RealSolverScanTests.Scan(_dir, "temperature = \"10 K\"\n[[axis]]\nname = \"V\"\nvalues = [150, 170, 190]\n[[axis]]\nname = \"t\"\nvalues = [90, 110]\n", mesh: 6);
        return Path.Combine(_dir, "test-scan.toml");
    }

    [Fact]
    public async Task Resume_after_cancellation_gives_the_rows_of_an_uninterrupted_run()
    {
        string scan = ScanFile();
        string full = Path.Combine(_dir, "full.parquet"), part = Path.Combine(_dir, "part.parquet");
        Assert.Equal(0, Run(NoSlurm(), "scan", scan, "--out", full).Code);

        using var cts = new CancellationTokenSource();
        var stopped = Run(NoSlurm(cts.Token, p => { if (p.Done >= 2) cts.Cancel(); }), "scan", scan, "--out", part);
        Assert.Equal(ScanCommand.Interrupted, stopped.Code);
        Assert.Contains("--resume", stopped.Err);
        Assert.False(File.Exists(part));
        Assert.True(Directory.GetFiles(part + ".parts", "chunk-*.parquet").Length > 0);

        var resumed = Run(NoSlurm(), "scan", scan, "--out", part, "--resume");
        Assert.Equal(0, resumed.Code);
        Assert.Contains("from an earlier run", resumed.Out);
        var a = await ScanParquet.ReadAsync(full);
        var b = await ScanParquet.ReadAsync(part);
        Assert.Equal(6, b.Rows.Count);
        // The path of the solver (which neighbour warm-started a point, hence its iterations and final residual) may
        // differ after a resume; the answers must agree within the solver's tolerance (1e-10 in the scan file) and the
        // labels exactly.
        string[] path = ["wall_seconds", "warm_started", "iterations", "residual_norm"];
        Assert.Equal(a.Rows.Count, b.Rows.Count);
        for (int i = 0; i < a.Rows.Count; i++)
            foreach (var c in a.Schema.Columns.Where(c => !path.Contains(c.Field.Name)))
            {
                object? x = c.Value(a.Rows[i]), y = b.Schema.Columns.Single(d => d.Field.Name == c.Field.Name).Value(b.Rows[i]);
                if (x is double dx && y is double dy)
                    Assert.True(Math.Abs(dx - dy) <= 1e-7 * Math.Max(1, Math.Abs(dx)), $"row {i} {c.Field.Name}: {dx:R} against {dy:R}");
                else Assert.Equal(x?.ToString(), y?.ToString());
            }
    }

    [Fact]
    public void Merge_with_a_missing_shard_exits_4_and_writes_nothing()
    {
        string scan = ScanFile();
        string shards = Directory.CreateDirectory(Path.Combine(_dir, "shards")).FullName;
        string baseOut = Path.Combine(shards, "res.parquet");
        Assert.Equal(0, Run(NoSlurm(), "scan", scan, "--out", baseOut, "--shard", "0/3").Code);
        Assert.Equal(0, Run(NoSlurm(), "scan", scan, "--out", baseOut, "--shard", "2/3").Code);
        Assert.Equal(2, Directory.GetFiles(shards, "*.shard-*.parquet").Length);

        string merged = Path.Combine(_dir, "merged.parquet");
        var r = Run(NoSlurm(), "scan", "merge", shards, "--out", merged);
        Assert.Equal(ExitCodes.NoAnswer, r.Code);
        Assert.Contains("missing shards: 1/3", r.Err);
        Assert.Contains("missing points", r.Err);
        Assert.False(File.Exists(merged));
    }

    [Fact]
    public void Sparse_Slurm_array_list_exits_2_and_says_to_pass_the_shard()
    {
        // `sbatch --array=1,2,7` sets ID 7, MIN 1, MAX 7, COUNT 3 (Slurm job-array documentation): not a regular range.
        var env = new Hashtable
        {
            ["SLURM_ARRAY_TASK_ID"] = "7", ["SLURM_ARRAY_TASK_MIN"] = "1", ["SLURM_ARRAY_TASK_MAX"] = "7", ["SLURM_ARRAY_TASK_COUNT"] = "3",
        };
        string output = Path.Combine(_dir, "x.parquet");
        var r = Run(new ScanCommandContext(() => env), "scan", ScanFile(), "--out", output);
        Assert.Equal(ExitCodes.BadInput, r.Code);
        Assert.Contains("--shard I/N", r.Err);
        Assert.Empty(Directory.GetFiles(_dir, "x*"));
    }
    [Fact]
    public void One_task_Slurm_array_exits_2_asks_for_the_shard_and_writes_nothing()
    {
        // A single resubmitted task (`sbatch --array=5`) sets ID = MIN = MAX = 5 and COUNT 1 (Slurm job-array documentation).
        var env = new Hashtable
        {
            ["SLURM_ARRAY_TASK_ID"] = "5", ["SLURM_ARRAY_TASK_MIN"] = "5", ["SLURM_ARRAY_TASK_MAX"] = "5", ["SLURM_ARRAY_TASK_COUNT"] = "1",
        };
        string output = Path.Combine(_dir, "one.parquet");
        var r = Run(new ScanCommandContext(() => env), "scan", ScanFile(), "--out", output);
        Assert.Equal(ExitCodes.BadInput, r.Code);
        Assert.Contains("--shard I/N", r.Err);
        Assert.Empty(Directory.GetFiles(_dir, "one*"));
        // Told the shard, the same task runs.
        Assert.Equal(0, Run(new ScanCommandContext(() => env), "scan", ScanFile(), "--out", output, "--shard", "0/1").Code);
        Assert.True(File.Exists(output));
    }
}
