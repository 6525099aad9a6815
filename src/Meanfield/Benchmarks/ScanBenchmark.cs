using System.Diagnostics;
using Meanfield.Scans;

namespace Meanfield.Benchmarks;

/// <summary>What a benchmark scan cost.</summary>
/// <param name="Points">Grid points solved.</param>
/// <param name="Mesh">k-mesh divisions of every solve.</param>
/// <param name="WallSeconds">Wall time of the whole scan (s).</param>
/// <param name="DiagonalisationFraction">Measured share of the available CPU time (wall x cores) spent diagonalising
/// inside the saddle-point solves.</param>
/// <param name="DigestSeconds">Wall seconds of the spectrum digests (phase, nodes, gaps, DOS, invariants) summed over
/// the points (points run in parallel, so this can exceed the scan's wall time).</param>
/// <param name="MeanIterationsWarm">Mean iterations of the warm-started points of the scan.</param>
/// <param name="WarmShare">Share of points that were warm-started.</param>
/// <param name="ColdSubset">Points re-solved from a cold start for comparison.</param>
/// <param name="MeanIterationsColdSubset">Mean iterations of that subset from a cold start.</param>
/// <param name="MeanIterationsWarmSubset">Mean iterations of the same subset in the scan (warm where it was).</param>
/// <param name="ColdSubsetSeconds">Wall time of the cold subset (s).</param>
/// <param name="NonConverged">Scan points that did not converge.</param>
/// <param name="ZonePasses">Zone passes over the scan.</param>
/// <param name="Phases">Points per phase label.</param>
public sealed record ScanBenchmarkResult(int Points, int Mesh, double WallSeconds, double DiagonalisationFraction, double DigestSeconds,
                                         double MeanIterationsWarm, double WarmShare, int ColdSubset, double MeanIterationsColdSubset,
                                         double MeanIterationsWarmSubset, double ColdSubsetSeconds, int NonConverged, long ZonePasses,
                                         IReadOnlyDictionary<string, int> Phases)
{
    /// <summary>Wall time per point (s).</summary>
    public double SecondsPerPoint => WallSeconds / Math.Max(1, Points);
    /// <summary>The wall time a grid of <paramref name="points"/> would take at this rate (s): points cost alike on average.</summary>
    public double Extrapolated(int points) => SecondsPerPoint * points;

    /// <summary>The lines of the benchmark report: points and phases, wall time (and a 32 x 32 grid at this rate), digest
    /// time, diagonalisation share, and iterations warm against cold.</summary>
    public IEnumerable<string> Describe()
    {
        var c = System.Globalization.CultureInfo.InvariantCulture;
        yield return string.Create(c, $"  points                       {Points} ({NonConverged} not converged): {string.Join(", ", Phases.Select(p => $"{p.Value} {p.Key}"))}");
        yield return string.Create(c, $"  wall time                    {WallSeconds:F1} s ({SecondsPerPoint:F3} s per point, {ZonePasses} zone passes); 32 x 32 at this rate: {Extrapolated(1024):F0} s");
        yield return string.Create(c, $"  digest (phase, nodes, DOS)   {DigestSeconds:F1} s summed over points ({DigestSeconds / Math.Max(1, Points):F3} s per point)");
        yield return string.Create(c, $"  diagonalisation share        {100 * DiagonalisationFraction:F0}% of wall x cores");
        yield return string.Create(c, $"  mean iterations (warm)       {MeanIterationsWarm:F2} over the {100 * WarmShare:F0}% warm-started points");
        yield return string.Create(c, $"  subset of {ColdSubset}: in scan       {MeanIterationsWarmSubset:F2} iterations; cold {MeanIterationsColdSubset:F2} iterations ({ColdSubsetSeconds:F1} s)");
    }
}

/// <summary>Runs a scan grid with the real solver, then re-solves a spread subset cold (library side of `meanfield bench --scan`).</summary>
public static class ScanBenchmark
{
    /// <summary>The shipped scan the benchmark runs by default (relative to the repository root).</summary>
    public const string DefaultScanFile = "scans/weyl-diamond-v-ratio.toml";

    /// <summary>
    /// The scan file <paramref name="path"/> resampled to <paramref name="points"/> values per axis over the same range
    /// (same spacing), solved on a <paramref name="mesh"/> mesh with the node and DOS columns on.
    /// </summary>
    /// <exception cref="RequestError">Fewer than 2 points or a mesh below 2.</exception>
    /// <exception cref="ScanFileError">The scan file does not read.</exception>
    public static ScanDefinition Resampled(string path, int points, int mesh)
    {
        if (points < 2) throw new RequestError($"--scan-size {points}: need at least 2 points per axis");
        if (mesh < 2) throw new RequestError($"--scan-mesh {mesh}: need at least 2 divisions");
        var scan = ScanFileReader.Load(path);
        var axes = scan.Axes.Select(a => a with
        {
            Values = a.Spacing == AxisSpacing.Log ? ScanAxis.Logarithmic(a.Values[0], a.Values[^1], points) : ScanAxis.Linear(a.Values[0], a.Values[^1], points),
            Spacing = a.Spacing == AxisSpacing.Log ? AxisSpacing.Log : AxisSpacing.Linear,
        }).ToList();
        return scan with { Axes = axes, Solver = scan.Solver with { Mesh = mesh }, Columns = scan.Columns with { Nodes = true, Dos = true } };
    }

    /// <summary>Runs <paramref name="scan"/> (every grid point), then re-solves <paramref name="coldSubset"/> spread points cold.</summary>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static async Task<ScanBenchmarkResult> RunAsync(ScanDefinition scan, int coldSubset, IProgress<ScanProgress>? progress, CancellationToken ct)
    {
        var grid = scan.ToGrid();
        var solver = SaddlePointPointSolver.For(scan);
        string dir = Directory.CreateTempSubdirectory("mf-bench-").FullName;
        try
        {
            var clock = Stopwatch.StartNew();
            await ScanRunner.RunAsync(grid, solver.Delegate, new ScanOutput(Path.Combine(dir, "bench.parquet"), scan.Provenance()),
                                      new ScanRunOptions { FlushEveryPoints = 1 << 20, FlushInterval = TimeSpan.FromDays(1) }, progress, ct);
            double wall = clock.Elapsed.TotalSeconds;
            var rows = (await ScanParquet.ReadAsync(Path.Combine(dir, "bench.parquet"), ct)).Rows;
            var warmRows = rows.Where(r => r.WarmStarted).ToList();

            int take = Math.Clamp(coldSubset, 1, rows.Count);
            var subset = Enumerable.Range(0, take).Select(i => rows[(int)((long)i * rows.Count / take)]).ToList();
            var cold = new SaddlePointPointSolver(Models.ModelFile.Parse(scan.ModelText, scan.ModelPath), scan.Solver, scan.Columns) { ColdOnly = true };
            clock.Restart();
            var coldIterations = subset.Select(r => cold.Solve(grid.Point(r.PointId), null, ct).Iterations).ToList();
            double coldSeconds = clock.Elapsed.TotalSeconds;
            var phases = rows.GroupBy(r => r.Result.Spectrum.Phase ?? "(none)").OrderByDescending(g => g.Count()).ToDictionary(g => g.Key, g => g.Count());

            return new ScanBenchmarkResult(rows.Count, scan.Solver.Mesh, wall, solver.DiagonalisationSeconds / (wall * Environment.ProcessorCount),
                solver.DigestSeconds, warmRows.Count == 0 ? 0 : warmRows.Average(r => r.Result.Iterations), warmRows.Count / (double)rows.Count,
                take, coldIterations.Average(), subset.Average(r => r.Result.Iterations), coldSeconds,
                rows.Count(r => !r.Result.Converged), solver.ZonePasses, phases);
        }
        finally { Directory.Delete(dir, recursive: true); }
    }
}
