using System.Collections;
using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

// Slurm job arrays: --array=0-7 sets SLURM_ARRAY_TASK_MIN=0, MAX=7, COUNT=8; --array=1-7:2 sets STEP=2 and runs ids
// 1, 3, 5, 7; --array=1,2,7 is a list with COUNT=3 (Slurm documentation, "Job Array Support", sbatch --array).
public class ShardSpecTests
{
    private static Hashtable Env(int id, int min, int max, int count, int? step = null)
    {
        var env = new Hashtable
        {
            ["SLURM_ARRAY_TASK_ID"] = id.ToString(), ["SLURM_ARRAY_TASK_MIN"] = min.ToString(),
            ["SLURM_ARRAY_TASK_MAX"] = max.ToString(), ["SLURM_ARRAY_TASK_COUNT"] = count.ToString(),
        };
        if (step is int s) env["SLURM_ARRAY_TASK_STEP"] = s.ToString();
        return env;
    }

    [Fact]
    public void Parse_reads_index_and_count_and_refuses_out_of_range()
    {
        Assert.Equal(new ShardSpec(3, 8), ShardSpec.Parse("3/8"));
        Assert.Throws<ScanError>(() => ShardSpec.Parse("8/8"));
        Assert.Throws<ScanError>(() => ShardSpec.Parse("3-8"));
        Assert.Throws<ScanError>(() => ShardSpec.Parse("-1/8"));
    }

    [Fact]
    public void Plain_range_maps_id_minus_min()
    {
        Assert.Equal(new ShardSpec(3, 8), ShardSpec.FromEnvironment(Env(3, 0, 7, 8)));
        Assert.Equal(new ShardSpec(0, 4), ShardSpec.FromEnvironment(Env(10, 10, 13, 4)));
    }

    [Fact]
    public void Stepped_range_1_to_7_step_2_maps_to_four_shards()
    {
        int[] ids = [1, 3, 5, 7];
        var shards = ids.Select(id => ShardSpec.FromEnvironment(Env(id, 1, 7, 4, 2))!.Value).ToList();
        Assert.Equal(new[] { 0, 1, 2, 3 }, shards.Select(s => s.Index));
        Assert.All(shards, s => Assert.Equal(4, s.Count));
    }

    [Fact]
    public void Sparse_list_is_refused_with_advice_to_pass_the_shard()
    {
        var e = Assert.Throws<ScanError>(() => ShardSpec.FromEnvironment(Env(2, 1, 7, 3)));
        Assert.Contains("--shard I/N", e.Message);
    }

    [Fact]
    public void Outside_a_job_array_there_is_no_shard() =>
        Assert.Null(ShardSpec.FromEnvironment(new Hashtable { ["HOME"] = "/root" }));

    [Fact]
    public void Shard_file_name_carries_index_and_count() =>
        Assert.Equal(Path.Combine("out", "run.shard-003-of-008.parquet"), new ShardSpec(3, 8).OutputPath(Path.Combine("out", "run.parquet")));
}

// A single task of an array (--array=7, or one task resubmitted) has SLURM_ARRAY_TASK_COUNT=1 (Slurm documentation,
// "Job Array Support"): which shard of the original array it is cannot be told from the environment.
public class ShardSpecSingleTaskTests
{
    [Fact]
    public void A_one_task_array_is_refused_and_asks_for_shard()
    {
        var env = new Hashtable
        {
            ["SLURM_ARRAY_TASK_ID"] = "7", ["SLURM_ARRAY_TASK_MIN"] = "7", ["SLURM_ARRAY_TASK_MAX"] = "7", ["SLURM_ARRAY_TASK_COUNT"] = "1",
        };
        var e = Assert.Throws<ScanError>(() => ShardSpec.FromEnvironment(env));
        Assert.Contains("--shard I/N", e.Message);
        Assert.Contains("SLURM_ARRAY_TASK_COUNT=1", e.Message);
    }

    [Theory]
    [InlineData(4, 5, 4, true)]    // 5 shards of 4 points: shard 4 is beyond them
    [InlineData(1, 10, 3, false)]  // 10 shards of 3 points: most are empty
    public void More_shards_than_points_are_refused(int index, int count, int points, bool beyond)
    {
        var e = Assert.Throws<ScanError>(() => new ShardSpec(index, count).CheckHasPoints(points));
        Assert.Contains($"the grid has {points} points", e.Message);
        Assert.Contains("nothing written", e.Message);
        Assert.Equal(beyond, e.Message.Contains($"shard {index} is beyond the points"));
    }

    [Fact]
    public void Every_shard_of_at_most_as_many_shards_as_points_has_points()
    {
        var grid = ScanTestData.Grid(7, 1);
        for (int n = 1; n <= 7; n++)
            for (int i = 0; i < n; i++)
            {
                new ShardSpec(i, n).CheckHasPoints(grid.Count);
                Assert.NotEmpty(grid.Shard(i, n));
            }
    }
}
