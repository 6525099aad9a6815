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
/// <param name="SolveCpuSeconds">Processor time of the process during the solve, all threads (s): less sensitive to other
/// load on the machine than the wall time.</param>
/// <param name="Iterations">Broyden iterations.</param>
/// <param name="ZonePasses">Passes over the fine mesh's wedge (each diagonalises every wedge point; the decoupled branch's
/// energies-only pass included).</param>
/// <param name="CoarsePasses">Passes on the half mesh that started the fine iteration.</param>
/// <param name="MicrosecondsPerKPointPass">Solve wall time / (passes x k-points), microseconds.</param>
/// <param name="BarePassSeconds">Wall time of one pass that only assembles and diagonalises (eigenvalues and vectors) every k of the full mesh.</param>
/// <param name="BareWedgeSeconds">The same bare pass over the wedge points only.</param>
/// <param name="PassSeconds">Wall time of one solver pass (assemble, diagonalise, reduce to the state table) on the wedge.</param>
/// <param name="JacobianSeconds">Wall time of the analytic Jacobian from one pass's kept eigenvectors (0 when not kept).</param>
/// <param name="WedgePoints">Points of the irreducible wedge.</param>
/// <param name="SymmetryOrder">Order of the symmetry group used.</param>
/// <param name="BytesPerPass">Bytes allocated by one solver pass, all threads (GC.GetTotalAllocatedBytes).</param>
/// <param name="PeakWorkingSetBytes">Peak working set of the process so far.</param>
/// <param name="Converged">Whether the solve converged.</param>
/// <param name="DigestSeconds">Wall time of what `solve` does after the saddle point: the solution handle and its
/// spectrum digest (phase, gaps, nodes, DOS at mu, invariants), from the solve's final pass (s); 0 when not converged.</param>
/// <param name="Phase">The digest's phase label (null when not converged).</param>
public sealed record SolveBenchmarkResult(int Mesh, int KPoints, int Bands, double SolveSeconds, double SolveCpuSeconds, int Iterations, int ZonePasses,
                                          int CoarsePasses, double MicrosecondsPerKPointPass, double BarePassSeconds,
                                          double BareWedgeSeconds, double PassSeconds, double JacobianSeconds, int WedgePoints,
                                          int SymmetryOrder, long BytesPerPass, long PeakWorkingSetBytes, bool Converged,
                                          double DigestSeconds = 0, string? Phase = null)
{
    /// <summary>Full-mesh points per wedge point.</summary>
    public double ReductionFactor => KPoints / (double)WedgePoints;
}

/// <summary>A finite-U solve against the infinite-U solve of the same lattice and mesh (wall and processor seconds,
/// fine zone passes plus the half-mesh start's passes counted at 1/8, iterations).</summary>
public sealed record FiniteUComparison(int Mesh, double U, double FiniteSeconds, double FiniteCpuSeconds, int FinitePasses,
                                       int FiniteIterations, bool FiniteConverged, double InfiniteSeconds, double InfiniteCpuSeconds,
                                       int InfinitePasses, int InfiniteIterations, bool InfiniteConverged)
{
    /// <summary>Finite-U over infinite-U wall time.</summary>
    public double Ratio => FiniteSeconds / InfiniteSeconds;
    /// <summary>Finite-U over infinite-U processor time (less sensitive to other load on the machine).</summary>
    public double CpuRatio => FiniteCpuSeconds / InfiniteCpuSeconds;

    /// <summary>One line of the benchmark report: both solves and the two ratios.</summary>
    /// <param name="unit">The model's energy unit symbol, for U.</param>
    public string Describe(string unit) => string.Create(System.Globalization.CultureInfo.InvariantCulture,
        $"{Mesh,5}  U = {U:G6} {unit}: finite {FiniteSeconds:F3} s ({FiniteCpuSeconds:F2} cpu s, {FiniteIterations} iter, {FinitePasses} passes{(FiniteConverged ? "" : ", NOT converged")}), " +
        $"infinite {InfiniteSeconds:F3} s ({InfiniteCpuSeconds:F2} cpu s, {InfiniteIterations} iter, {InfinitePasses} passes{(InfiniteConverged ? "" : ", NOT converged")}); ratio {Ratio:F2} wall, {CpuRatio:F2} cpu");
}

/// <summary>Measures full solves and single passes of a bound model (library side of `meanfield bench`).</summary>
public static class SolveBenchmark
{
    /// <summary>Times a full solve of <paramref name="model"/>, its digest as `solve` makes it, and single passes over its mesh.</summary>
    /// <exception cref="RequestError">A model without momentum, or one the solver refuses.</exception>
    public static SolveBenchmarkResult Run(BoundModel model, SolverSettings settings, CancellationToken ct = default)
    {
        var solver = new SaddlePointSolver(model, settings);
        if (solver.StateSum is not MeshStateSum sum) throw new RequestError($"{model.SourcePath}: the benchmark needs a lattice with momentum (a k-mesh)");
        using var self = Process.GetCurrentProcess();
        var cpu0 = self.TotalProcessorTime;
        var clock = Stopwatch.StartNew();
        var sp = solver.Solve(ct);
        double solveSeconds = clock.Elapsed.TotalSeconds;
        self.Refresh();
        double cpu = (self.TotalProcessorTime - cpu0).TotalSeconds;

        double digest = 0; string? phase = null;
        if (sp.Converged)
        {
            clock.Restart();
            var solution = Solutions.Solution.FromSaddlePoint(model, sp, settings);
            phase = Analysis.SpectrumSummary.Compute(solution).Phase?.Name;
            digest = clock.Elapsed.TotalSeconds;
        }

        // One more pass at the solution: warm caches, then measure time and allocation of the best of three.
        sum.Fill(sp.Amplitudes);
        long before = GC.GetTotalAllocatedBytes(precise: true);
        sum.Fill(sp.Amplitudes);
        long bytes = GC.GetTotalAllocatedBytes(precise: true) - before;
        double pass = double.PositiveInfinity, jacobian = 0;
        for (int i = 0; i < 3; i++)
        {
            clock.Restart();
            sum.Fill(sp.Amplitudes);
            pass = Math.Min(pass, clock.Elapsed.TotalSeconds);
        }
        var derivatives = new double[4 * sp.Groups.Count * sp.Groups.Count];
        clock.Restart();
        if (sum.TryDerivatives(sp.Mu, settings.Temperature, derivatives)) jacobian = clock.Elapsed.TotalSeconds;

        var all = Enumerable.Range(0, sum.Mesh.Count).ToArray();
        var wedge = sum.Irreducible.Representatives.ToArray();
        double bare = Math.Min(BarePass(solver.Bare, sum.Mesh, all), BarePass(solver.Bare, sum.Mesh, all));
        double bareWedge = Math.Min(BarePass(solver.Bare, sum.Mesh, wedge), BarePass(solver.Bare, sum.Mesh, wedge));
        self.Refresh();
        return new SolveBenchmarkResult(settings.Mesh, sum.Mesh.Count, solver.Bare.Size, solveSeconds, cpu, sp.Iterations, sp.ZonePasses,
            solver.CoarsePasses, 1e6 * solveSeconds / Math.Max(1, sp.ZonePasses) / sum.Irreducible.Count, bare, bareWedge, pass,
            jacobian, sum.Irreducible.Count, sum.Irreducible.Group.Order, bytes, self.PeakWorkingSet64, sp.Converged, digest, phase);
    }

    /// <summary>
    /// A finite-U solve against the infinite-U solve of the same lattice on the same mesh: the model with every shell at
    /// repulsion <paramref name="u"/> (default: the model's own U when it has one, else 4 times its largest energy) and
    /// the model with every shell at infinite U, each solved once from the built-in starts.
    /// </summary>
    /// <exception cref="ArgumentException">A model the finite-U solver refuses (a Zeeman field, N != 2), or U &lt; 0.</exception>
    public static FiniteUComparison CompareFiniteU(BoundModel model, SolverSettings settings, double? u = null, CancellationToken ct = default)
    {
        double scale = 1;
        foreach (var s in model.Shells) scale = Math.Max(scale, Math.Abs(s.Level));
        foreach (var h in model.Hoppings) scale = Math.Max(scale, h.Amplitude.MaxAbs());
        double repulsion = u ?? model.Shells.FirstOrDefault(s => s.HasFiniteU)?.U ?? 4 * scale;
        if (!(repulsion >= 0) || double.IsInfinity(repulsion)) throw new RequestError($"--finite-u {repulsion}: U must be finite and >= 0");
        var finite = model.With(shells: [.. model.Shells.Select(s => s with { U = repulsion })]);
        var infinite = model.With(shells: [.. model.Shells.Select(s => s with { U = double.PositiveInfinity })]);
        var (fs, fcpu, fsp) = Timed(finite, settings, ct);
        var (isec, icpu, isp) = Timed(infinite, settings, ct);
        return new FiniteUComparison(settings.Mesh, repulsion, fs, fcpu, fsp.ZonePasses, fsp.Iterations, fsp.Converged,
                                     isec, icpu, isp.ZonePasses, isp.Iterations, isp.Converged);
    }

    private static (double Seconds, double Cpu, SaddlePoint Result) Timed(BoundModel model, SolverSettings settings, CancellationToken ct)
    {
        using var self = Process.GetCurrentProcess();
        var cpu0 = self.TotalProcessorTime;
        var clock = Stopwatch.StartNew();
        var solver = new SaddlePointSolver(model, settings);
        var sp = solver.Solve(ct);
        double seconds = clock.Elapsed.TotalSeconds;
        self.Refresh();
        return (seconds, (self.TotalProcessorTime - cpu0).TotalSeconds, sp with { ZonePasses = sp.ZonePasses + solver.CoarsePasses / 8 });
    }

    /// <summary>The floor: assemble H(k) and compute eigenvalues and eigenvectors at every k, in parallel, nothing else.</summary>
    public static double BarePass(IBlochSource source, KMesh mesh) => BarePass(source, mesh, Enumerable.Range(0, mesh.Count).ToArray());

    /// <summary>The bare pass over the listed mesh points only (the wedge, for the reduced floor).</summary>
    public static double BarePass(IBlochSource source, KMesh mesh, int[] points)
    {
        int n = source.Size, chunks = Math.Max(1, Environment.ProcessorCount);
        var clock = Stopwatch.StartNew();
        Parallel.For(0, chunks, c =>
        {
            var solver = Eigensolvers.Create(n);
            var h = new Complex[n * n]; var s = new Complex[n * n]; var v = new Complex[n * n]; var e = new double[n];
            int start = (int)((long)points.Length * c / chunks), end = (int)((long)points.Length * (c + 1) / chunks);
            for (int k = start; k < end; k++)
            {
                source.Assemble(mesh.Cartesian(points[k]), h, s);
                solver.Solve(h, e, v);
            }
        });
        return clock.Elapsed.TotalSeconds;
    }
}
