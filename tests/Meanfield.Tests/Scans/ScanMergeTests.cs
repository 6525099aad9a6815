using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

// Completeness is checked against the grid stored in each file (row-major ids 0..N-1, each exactly once).
public sealed class ScanMergeTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-scanmerge-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    private async Task<string> RunShard(ScanGrid grid, int i, int n, string scanText = ScanTestData.ScanText, string name = "run.parquet")
    {
        var shard = new ShardSpec(i, n);
        string path = shard.OutputPath(Path.Combine(_dir, name));
        await ScanRunner.RunAsync(grid, new FakeSolver().Solve, new ScanOutput(path, ScanTestData.Provenance(scanText)),
                                  new ScanRunOptions { Shard = shard }, null, CancellationToken.None);
        return path;
    }

    [Fact]
    public async Task Complete_shards_merge_into_one_sorted_file()
    {
        var grid = ScanTestData.Grid(5, 4);
        for (int i = 0; i < 3; i++) await RunShard(grid, i, 3);
        string merged = Path.Combine(_dir, "merged.parquet");
        var report = ScanMerge.Merge(_dir, merged);
        Assert.True(report.Complete, report.ToString());
        Assert.True(report.Written);
        var table = await ScanParquet.ReadAsync(merged);
        Assert.Equal(Enumerable.Range(0, 20), table.Rows.Select(r => r.PointId));
        Assert.Equal(new[] { 0, 1, 2 }, table.Rows.Select(r => r.Shard).Distinct().Order());
        Assert.Equal("0/1", table.Metadata[ScanMetadata.Shard]);
        Assert.Contains("merged by `scan merge` from 3 shard file(s) of a 3-shard run", table.Metadata[ScanMetadata.Merged]);
        Assert.Equal(3, table.Metadata[ScanMetadata.MergedFiles].Split('\n').Count(File.Exists));
        Assert.Equal("K", table.Metadata["unit.temperature_K"]);
        // A shard's own file is not described as merged.
        Assert.False((await ScanParquet.ReadAsync(new ShardSpec(0, 3).OutputPath(Path.Combine(_dir, "run.parquet")))).Metadata.ContainsKey(ScanMetadata.Merged));
    }

    [Fact]
    public async Task Every_numeric_column_carries_its_unit_in_its_own_metadata()
    {
        var grid = ScanTestData.Grid(2, 2);
        string path = await RunShard(grid, 0, 1, name: "units.parquet");
        await using var stream = File.OpenRead(path);
        await using var reader = await Parquet.ParquetReader.CreateAsync(stream);
        using var rg = reader.OpenRowGroupReader(0);
        var f = reader.Schema.DataFields;
        Assert.Equal("meV", rg.GetCustomMetadata(f.Single(x => x.Name == "mu"))["unit"]);
        Assert.Equal("K", rg.GetCustomMetadata(f.Single(x => x.Name == "temperature_K"))["unit"]);
        Assert.Equal("meV", reader.CustomMetadata["unit.mu"]);
        Assert.Equal("text", reader.CustomMetadata["unit.phase"]);
    }

    [Fact]
    public async Task A_missing_shard_is_reported_with_its_points_and_nothing_is_written()
    {
        var grid = ScanTestData.Grid(5, 4);
        var files = new List<string> { await RunShard(grid, 0, 3), await RunShard(grid, 2, 3) };
        string merged = Path.Combine(_dir, "merged.parquet");
        var report = ScanMerge.Merge(files, merged);
        Assert.False(report.Written);
        Assert.False(File.Exists(merged));
        Assert.Equal(new[] { "1/3" }, report.MissingShards);
        Assert.Equal(grid.Shard(1, 3).Order(), report.Missing.Select(m => m.PointId));
        var first = report.Missing[0];
        var index = grid.IndexOf(first.PointId);
        Assert.Equal(grid.Axes[0].Values[index[0]], first.AxisValues[0].Value);
        Assert.Equal("ratio", first.AxisValues[1].Key);
        Assert.Contains($"point {first.PointId} (V = ", report.ToString());

        var partial = ScanMerge.Merge(files, merged, allowIncomplete: true);
        Assert.True(partial.Written);
    }

    [Fact]
    public async Task A_duplicated_point_is_reported_with_both_files()
    {
        var grid = ScanTestData.Grid(5, 4);
        var files = new List<string>();
        for (int i = 0; i < 2; i++) files.Add(await RunShard(grid, i, 2));
        // The same shard computed twice (for example a re-submitted array task) under another name.
        files.Add(await RunShard(grid, 0, 2, name: "again.parquet"));
        var report = ScanMerge.Merge(files, Path.Combine(_dir, "merged.parquet"));
        Assert.False(report.Written);
        Assert.Empty(report.Missing);
        Assert.Equal(grid.Shard(0, 2).Order(), report.Duplicated.Select(d => d.PointId));
        Assert.Equal(2, report.Duplicated[0].Files.Count);
    }

    [Fact]
    public async Task Files_of_different_scans_are_not_mixed()
    {
        var grid = ScanTestData.Grid(5, 4);
        var files = new List<string> { await RunShard(grid, 0, 2), await RunShard(grid, 1, 2, scanText: "# another scan\n", name: "other.parquet") };
        var e = Assert.Throws<ScanError>(() => ScanMerge.Merge(files, Path.Combine(_dir, "merged.parquet")));
        Assert.Contains("different scan", e.Message);
    }
}
