using Meanfield.Benchmarks;
using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

/// <summary>
/// `bench` runs its per-mesh solve and times `solve` as fresh processes of this same program. Only what could be wrong
/// is checked (the child really solves, the report is of that command, bad counts are refused); no time is asserted.
/// </summary>
public class BenchCommandTests
{
    [Fact]
    public void WholeProcessLineTimesARealSolve()
    {
        var model = CliRun.ModelPath("kondo-insulator-sc.toml");
        var (code, stdout, err) = CliRun.Run("bench", model, "--meshes", "6", "--process-runs", "2", "--finite-u", "off");
        Assert.True(code == ExitCodes.Success, err);
        var line = stdout.Split('\n').Single(l => l.StartsWith("whole process:", StringComparison.Ordinal));
        Assert.Contains($"`meanfield solve {model} --mesh 6`, 2 runs: median", line);
        // A child that failed (bad arguments, a missing runtime) would be reported with its exit code.
        Assert.DoesNotContain("exited", line);
    }

    [Theory]
    [InlineData("-1")]
    [InlineData("1001")]
    public void ProcessRunsOutOfRangeIsRefused(string runs)
    {
        var (code, _, err) = CliRun.Run("bench", CliRun.ModelPath("kondo-insulator-sc.toml"), "--meshes", "6", "--process-runs=" + runs, "--finite-u", "off");
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("--process-runs", err);
    }

    [Fact]
    public void MedianOfOddAndEvenCounts()
    {
        // Common practice: the middle value, or the mean of the two middle values.
        Assert.Equal(0.3, new ProcessTiming("x", [0.5, 0.3, 0.1], 0).MedianSeconds, 15);
        Assert.Equal(0.35, new ProcessTiming("x", [0.5, 0.3, 0.1, 0.4], 0).MedianSeconds, 15);
    }
}
