using System.Diagnostics;
using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Solver;

namespace Meanfield.Benchmarks;

/// <summary>Cost of one full saddle-point solve on one mesh, against the floor of one bare diagonalisation pass.</summary>
/// <param name="Mesh">Divisions per reciprocal vector.</param>
/// <param name="KPoints">k-points of the mesh.</param>
/// <param name="Bands">Size of H(k).</param>
/// <param name="SolveSeconds">Wall time of the solve (s).</param>
/// <param name="Iterations">Broyden iterations.</param>
/// <param name="ZonePasses">Full passes over the zone (each diagonalises every k-point).</param>
/// <param name="MicrosecondsPerKPointPass">Solve wall time / (passes x k-points), microseconds.</param>
/// <param name="BarePassSeconds">Wall time of one pass that only assembles and diagonalises (eigenvalues and vectors) every k.</param>
/// <param name="PassSeconds">Wall time of one solver pass (assemble, diagonalise, reduce to the state table).</param>
/// <param name="BytesPerPass">Bytes allocated by one solver pass, all threads (GC.GetTotalAllocatedBytes).</param>
/// <param name="PeakWorkingSetBytes">Peak working set of the process so far.</param>
/// <param name="Converged">Whether the solve converged.</param>
public sealed record SolveBenchmarkResult(int Mesh, int KPoints, int Bands, double SolveSeconds, int Iterations, int ZonePasses,
                                          double MicrosecondsPerKPointPass, double BarePassSeconds, double PassSeconds,
                                          long BytesPerPass, long PeakWorkingSetBytes, bool Converged);

/// <summary>Measures full solves and single passes of a bound model (library side of `meanfield bench`).</summary>
public static class SolveBenchmark
{
    public static SolveBenchmarkResult Run(BoundModel model, SolverSettings settings, CancellationToken ct = default)
    {
        var solver = new SaddlePointSolver(model, settings);
        if (solver.StateSum is not MeshStateSum sum) throw new ArgumentException("the benchmark needs a lattice with momentum (a k-mesh)");
        var clock = Stopwatch.StartNew();
        var sp = solver.Solve(ct);
        double solveSeconds = clock.Elapsed.TotalSeconds;

        // One more pass at the solution: warm caches, then measure time and allocation of a second one.
        sum.Fill(sp.Amplitudes);
        long before = GC.GetTotalAllocatedBytes(precise: true);
        clock.Restart();
        sum.Fill(sp.Amplitudes);
        double pass = clock.Elapsed.TotalSeconds;
        long bytes = GC.GetTotalAllocatedBytes(precise: true) - before;

        double bare = BarePass(solver.Bare, sum.Mesh);
        bare = Math.Min(bare, BarePass(solver.Bare, sum.Mesh));
        using var self = Process.GetCurrentProcess();
        self.Refresh();
        return new SolveBenchmarkResult(settings.Mesh, sum.Mesh.Count, solver.Bare.Size, solveSeconds, sp.Iterations, sp.ZonePasses,
            1e6 * solveSeconds / Math.Max(1, sp.ZonePasses) / sum.Mesh.Count, bare, pass, bytes, self.PeakWorkingSet64, sp.Converged);
    }

    /// <summary>The floor: assemble H(k) and compute eigenvalues and eigenvectors at every k, in parallel, nothing else.</summary>
    public static double BarePass(IBlochSource source, KMesh mesh)
    {
        int n = source.Size, chunks = Math.Max(1, Environment.ProcessorCount);
        var clock = Stopwatch.StartNew();
        Parallel.For(0, chunks, c =>
        {
            var solver = Eigensolvers.Create(n);
            var h = new Complex[n * n]; var s = new Complex[n * n]; var v = new Complex[n * n]; var e = new double[n];
            int start = (int)((long)mesh.Count * c / chunks), end = (int)((long)mesh.Count * (c + 1) / chunks);
            for (int k = start; k < end; k++)
            {
                source.Assemble(mesh.Cartesian(k), h, s);
                solver.Solve(h, e, v);
            }
        });
        return clock.Elapsed.TotalSeconds;
    }
}
