using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

/// <summary>One writer per scan output: the lock file names its holder, refuses a live one and takes over a dead one.</summary>
public sealed class OutputLockTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-lock-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    private string Out => Path.Combine(_dir, "scan.parquet");

    private static Task<ScanSummary> Run(string path, List<string>? notices = null) =>
        ScanRunner.RunAsync(ScanTestData.Grid(3, 2), new FakeSolver().Solve, new ScanOutput(path, ScanTestData.Provenance()),
            new ScanRunOptions { Notice = notices is null ? null : notices.Add }, null, CancellationToken.None);

    [Fact]
    public async Task A_finished_run_leaves_no_lock()
    {
        await Run(Out);
        Assert.True(File.Exists(Out));
        Assert.False(File.Exists(OutputLock.PathFor(Out)));
    }

    [Fact]
    public async Task A_live_holder_is_refused_by_name_and_nothing_is_written()
    {
        using var held = OutputLock.Acquire(Out, null);
        var (host, pid, _) = OutputLock.Self();
        var e = await Assert.ThrowsAsync<ScanError>(() => Run(Out));
        Assert.Contains($"host {host}, process {pid}", e.Message);
        Assert.Contains(OutputLock.PathFor(Out), e.Message);
        Assert.False(File.Exists(Out));
        Assert.False(Directory.Exists(Out + ".parts"));
        Assert.True(File.Exists(OutputLock.PathFor(Out))); // the holder's lock stays
    }

    [Fact]
    public async Task A_holder_on_another_host_is_refused()
    {
        File.WriteAllText(OutputLock.PathFor(Out), "host = node-elsewhere-17\npid = 4242\nstarted = 2026-01-01T00:00:00.000Z\n");
        var e = await Assert.ThrowsAsync<ScanError>(() => Run(Out));
        Assert.Contains("host node-elsewhere-17, process 4242", e.Message);
        Assert.False(File.Exists(Out));
    }

    [Fact]
    public async Task A_stale_lock_of_a_dead_process_is_taken_over_with_a_notice()
    {
        // A process that has exited: its id names no running process started at that time.
        using var child = System.Diagnostics.Process.Start(new System.Diagnostics.ProcessStartInfo("true") { UseShellExecute = false })!;
        child.WaitForExit();
        File.WriteAllText(OutputLock.PathFor(Out), $"host = {Environment.MachineName}\npid = {child.Id}\nstarted = 2026-01-01T00:00:00.000Z\n");
        var notices = new List<string>();
        await Run(Out, notices);
        Assert.True(File.Exists(Out));
        Assert.Contains(notices, n => n.Contains("took over the stale lock") && n.Contains($"process {child.Id}"));
        Assert.False(File.Exists(OutputLock.PathFor(Out)));
    }

    [Fact]
    public void A_lock_naming_no_holder_is_refused()
    {
        File.WriteAllText(OutputLock.PathFor(Out), "garbage\n");
        var e = Assert.Throws<ScanError>(() => OutputLock.Acquire(Out, null));
        Assert.Contains("names no holder", e.Message);
    }

    [Fact]
    public async Task An_empty_shard_writes_nothing()
    {
        var e = await Assert.ThrowsAsync<ScanError>(() => ScanRunner.RunAsync(ScanTestData.Grid(2, 2), new FakeSolver().Solve, // 4 points, 6 shards
            new ScanOutput(new ShardSpec(5, 6).OutputPath(Out), ScanTestData.Provenance()), new ScanRunOptions { Shard = new ShardSpec(5, 6) }, null, CancellationToken.None));
        Assert.Contains("shard 5 is beyond the points", e.Message);
        Assert.Empty(Directory.GetFileSystemEntries(_dir));
    }
}
