using System.Globalization;
using Meanfield.Models;
using Meanfield.Units;

namespace Meanfield.Scans;

/// <summary>
/// A scan ready to run: the scan file read against its model's parameters, the grid, the shard this process computes
/// and its output file checked against the inputs. The one entry point of a scan run; the command line only adds a
/// progress display.
/// </summary>
public sealed class ScanJob
{
    private readonly SaddlePointPointSolver _solver;
    private readonly ScanOutput _output;

    /// <summary>The scan as read (axes, ties, solver settings, model path).</summary>
    public ScanDefinition Scan { get; }
    /// <summary>The whole grid in snake order.</summary>
    public ScanGrid Grid { get; }
    /// <summary>The slice of <see cref="Grid"/> this run computes.</summary>
    public ShardSpec Shard { get; }
    /// <summary>The Parquet file this run writes (a shard's own name when sharded).</summary>
    public string OutputPath { get; }
    /// <summary>Points of this shard.</summary>
    public int Points { get; }

    private ScanJob(ScanDefinition scan, ScanGrid grid, ShardSpec shard, string output, SaddlePointPointSolver solver, ScanOutput file)
    {
        Scan = scan; Grid = grid; Shard = shard; OutputPath = output; _solver = solver; _output = file;
        Points = grid.Shard(shard).Count;
    }

    /// <summary>Reads and checks everything a run needs before any point is solved.</summary>
    /// <param name="scanPath">The scan file (.toml).</param>
    /// <param name="outputPath">The requested result file; a shard writes its own name derived from it.</param>
    /// <param name="shard">The slice to compute (<see cref="ShardSpec.Whole"/> for the whole grid).</param>
    /// <exception cref="ScanError">The scan file is missing or wrong, or the shard has no points.</exception>
    /// <exception cref="ModelError">The scan's model file is wrong.</exception>
    /// <exception cref="Output.OutputPathException">The output would overwrite an input.</exception>
    public static ScanJob Prepare(string scanPath, string outputPath, ShardSpec shard)
    {
        if (!File.Exists(scanPath)) throw new ScanError($"{scanPath}: scan file not found");
        var first = ScanFileReader.Load(scanPath);
        var spec = ModelFile.Load(first.ModelPath);
        var scan = ScanFileReader.Load(scanPath, spec.Parameters.Select(p => p.Name).ToList());
        var grid = scan.ToGrid();
        shard.CheckHasPoints(grid.Count);
        var target = shard.OutputPath(outputPath);
        Output.OutputGuard.Check(target, [scanPath, first.ModelPath]);
        return new ScanJob(scan, grid, shard, target, SaddlePointPointSolver.For(scan), new ScanOutput(target, scan.Provenance(spec.Header.Unit.Symbol())));
    }

    /// <summary>"scan NAME: P points (shard ...), mesh M, model F -> OUT": what is about to run.</summary>
    public string Heading(string scanPath)
    {
        string part = Shard.IsWhole ? "" : $" (shard {Shard} of a {Grid.Count}-point grid)";
        return $"scan {Path.GetFileName(scanPath)}: {Points} points{part}, mesh {Scan.Solver.Mesh}, model {Path.GetFileName(Scan.ModelPath)} -> {OutputPath}";
    }

    /// <summary>Solves every point of the shard (see <see cref="ScanRunner.RunAsync"/>); the shard of <paramref name="options"/> is replaced by this job's.</summary>
    /// <exception cref="OperationCanceledException">Cancelled; finished points stay in the chunk directory for a resume.</exception>
    public Task<ScanSummary> RunAsync(ScanRunOptions options, IProgress<ScanProgress>? progress, CancellationToken ct) =>
        ScanRunner.RunAsync(Grid, _solver.Delegate, _output, options with { Shard = Shard }, progress, ct);

    /// <summary>
    /// One line on a finished run: points, converged, not converged (and failed), wall time, mean iterations and the
    /// share of warm-started points, read back from the file written.
    /// </summary>
    public static async Task<string> DescribeAsync(ScanSummary s, CancellationToken ct = default)
    {
        var solved = (await ScanParquet.ReadAsync(s.OutputPath, ct)).Rows;
        double meanIterations = solved.Count == 0 ? 0 : solved.Average(r => r.Result.Iterations);
        double warm = solved.Count == 0 ? 0 : solved.Count(r => r.WarmStarted) / (double)solved.Count;
        string resumed = s.Resumed > 0 ? $" ({s.Resumed} from an earlier run)" : "";
        string bad = s.NonConverged > 0 ? $"{s.NonConverged} NOT converged (kept, flagged converged = false)" : "0 not converged";
        if (s.Failed > 0) bad += $", of which {s.Failed} failed with an error (see the error column)";
        return string.Create(CultureInfo.InvariantCulture,
            $"done: {s.Total} points{resumed}, {s.Total - s.NonConverged} converged, {bad}; wall {s.Elapsed.TotalSeconds:F1} s; mean iterations {meanIterations:F1}; warm-started {100 * warm:F0}%; wrote {s.OutputPath}");
    }
}
