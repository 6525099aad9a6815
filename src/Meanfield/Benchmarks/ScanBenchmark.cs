using System.Diagnostics;
using Meanfield.Scans;

namespace Meanfield.Benchmarks;

/// <summary>What a benchmark scan cost.</summary>
/// <param name="Points">Grid points solved.</param>
/// <param name="WallSeconds">Wall time of the whole scan (s).</param>
/// <param name="DiagonalisationFraction">Estimated share of the available CPU time (wall x cores) spent diagonalising
/// inside the saddle-point solves.</param>
/// <param name="MeanIterationsWarm">Mean iterations of the warm-started points of the scan.</param>
/// <param name="WarmShare">Share of points that were warm-started.</param>
/// <param name="ColdSubset">Points re-solved from a cold start for comparison.</param>
/// <param name="MeanIterationsColdSubset">Mean iterations of that subset from a cold start.</param>
/// <param name="MeanIterationsWarmSubset">Mean iterations of the same subset in the scan (warm where it was).</param>
/// <param name="ColdSubsetSeconds">Wall time of the cold subset (s).</param>
/// <param name="NonConverged">Scan points that did not converge.</param>
/// <param name="ZonePasses">Zone passes over the scan.</param>
public sealed record ScanBenchmarkResult(int Points, double WallSeconds, double DiagonalisationFraction, double MeanIterationsWarm,
                                         double WarmShare, int ColdSubset, double MeanIterationsColdSubset,
                                         double MeanIterationsWarmSubset, double ColdSubsetSeconds, int NonConverged, long ZonePasses);

/// <summary>Runs a scan grid with the real solver, then re-solves a spread subset cold (library side of `meanfield bench --scan`).</summary>
public static class ScanBenchmark
{
    public static async Task<ScanBenchmarkResult> RunAsync(ScanDefinition scan, ScanGrid grid, int coldSubset,
                                                           IProgress<ScanProgress>? progress, CancellationToken ct)
    {
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
            var cold = new SaddlePointPointSolver(ModelOf(scan), scan.Solver, scan.Columns) { ColdOnly = true };
            clock.Restart();
            var coldIterations = subset.Select(r => cold.Solve(grid.Point(r.PointId), null, ct).Iterations).ToList();
            double coldSeconds = clock.Elapsed.TotalSeconds;

            return new ScanBenchmarkResult(rows.Count, wall, solver.DiagonalisationSeconds / (wall * Environment.ProcessorCount),
                warmRows.Count == 0 ? double.NaN : warmRows.Average(r => r.Result.Iterations), warmRows.Count / (double)rows.Count,
                take, coldIterations.Average(), subset.Average(r => r.Result.Iterations), coldSeconds,
                rows.Count(r => !r.Result.Converged), solver.ZonePasses);
        }
        finally { Directory.Delete(dir, recursive: true); }
    }

    private static Models.ModelSpec ModelOf(ScanDefinition scan) => Models.ModelFile.Parse(scan.ModelText, scan.ModelPath);
}
