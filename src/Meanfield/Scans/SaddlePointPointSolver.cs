using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Scans;

/// <summary>
/// The scan's <see cref="PointSolver"/> backed by <see cref="SaddlePointSolver"/>: binds the model with the point's
/// overrides, solves at the point's temperature from the neighbour's amplitudes when they fit, and fills every column.
/// Thread-safe: each call builds its own model and solver; consecutive calls share a symmetry group that still holds,
/// wedges and state buffers through a pool of <see cref="SolveReuse"/> (one per concurrent call), which leaves every
/// result as it is. Counts zone passes and diagonalisation time for benchmarks.
/// </summary>
public sealed class SaddlePointPointSolver
{
    private readonly ModelSpec _spec;
    private ScanDefinition? _scan;
    private long _passes, _diagonalisationTicks, _solves, _iterations, _digestTicks;
    private readonly System.Collections.Concurrent.ConcurrentBag<SolveReuse> _reuse = [];

    /// <summary>
    /// A solve that stops short of convergence with every r below this was collapsing onto the decoupled solution
    /// (r = 0 solves the saddle-point equations exactly; Read &amp; Newns 1983): that solution is reported instead.
    /// </summary>
    public const double CollapsingR = 1e-3;

    public ScanSolverSettings Settings { get; }
    public ScanColumnRequest Columns { get; }
    /// <summary>Ignore warm starts (for measuring what they save).</summary>
    public bool ColdOnly { get; init; }

    public SaddlePointPointSolver(ModelSpec spec, ScanSolverSettings settings, ScanColumnRequest columns)
    {
        _spec = spec; Settings = settings; Columns = columns;
    }

    /// <summary>
    /// A solver for a parsed scan file (the model is re-parsed from the text the scan's hash covers). Errors that would
    /// fail every point are refused here: a [fixed] value that does not bind (named by scan file, line and field), and a
    /// model that fails to bind the same way at its defaults and at the first point.
    /// </summary>
    /// <exception cref="ScanFileError">A fixed value does not bind.</exception>
    /// <exception cref="ModelError">The model does not bind, independently of the scanned values.</exception>
    public static SaddlePointPointSolver For(ScanDefinition scan)
    {
        var solver = new SaddlePointPointSolver(ModelFile.Parse(scan.ModelText, scan.ModelPath), scan.Solver, scan.Columns) { _scan = scan };
        solver.CheckBindsAtLoad(scan.ToGrid());
        return solver;
    }

    private void CheckBindsAtLoad(ScanGrid grid)
    {
        var fixedOnly = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var kv in _scan!.Fixed) fixedOnly[kv.Key] = kv.Value;
        ModelError? atDefaults = null;
        try { ModelBinder.Bind(_spec, fixedOnly); }
        catch (ModelError e) when (e.File == ModelBinder.OverrideSource && _scan.Source(e.Field) is { } src)
        {
            throw new ScanFileError(_scan.SourcePath, src.Line, src.Field, fixedOnly.GetValueOrDefault(e.Field) is { } v && !e.Problem.Contains(v, StringComparison.Ordinal) ? $"\"{v}\": {e.Problem}" : e.Problem);
        }
        catch (ModelError e) { atDefaults = e; }
        if (atDefaults is null) return;
        var first = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var kv in grid.Point(grid.SnakeId(0)).Overrides) first[kv.Key] = kv.Value;
        try { ModelBinder.Bind(_spec, first); }
        catch (ModelError again) when (again.Message == atDefaults.Message) { throw atDefaults; }
        catch (ModelError) { } // depends on the values: flagged at the points where it happens when the scan runs
    }

    /// <summary>The model at a point; an override that fails names the scan file, its line and the point.</summary>
    private BoundModel Bind(ScanPoint point)
    {
        var overrides = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var kv in point.Overrides) overrides[kv.Key] = kv.Value; // insertion order kept: evaluated in order
        try { return ModelBinder.Bind(_spec, overrides); }
        catch (ModelError e) when (e.File == ModelBinder.OverrideSource && _scan?.Source(e.Field) is { } src)
        {
            throw new ScanFileError(_scan.SourcePath, src.Line, src.Field, $"{e.Problem}{(point.Override(e.Field) is { } v && !e.Problem.Contains(v, StringComparison.Ordinal) ? $" (value \"{v}\")" : "")} at {point.Label}");
        }
        catch (ModelError e) when (e.File != ModelBinder.OverrideSource)
        {
            throw new ModelError(new SourceLocation(e.File, e.Line, e.Column), e.Field, $"{e.Problem} at {point.Label} of the scan", e.Suggestion);
        }
    }

    public PointSolver Delegate => Solve;

    /// <summary>Zone passes (full diagonalisations of the mesh) over all solves so far.</summary>
    public long ZonePasses => Interlocked.Read(ref _passes);
    public long Solves => Interlocked.Read(ref _solves);
    public long Iterations => Interlocked.Read(ref _iterations);
    /// <summary>
    /// CPU seconds (summed over threads) spent diagonalising inside the saddle-point solves on their own mesh, measured
    /// over every pass. (Passes differ: the decoupled branch's last pass finds eigenvalues only, the others vectors too.)
    /// </summary>
    public double DiagonalisationSeconds => Interlocked.Read(ref _diagonalisationTicks) / (double)TimeSpan.TicksPerSecond;
    /// <summary>Wall seconds spent in the spectrum digests (phase, nodes, gaps, DOS, invariants), summed over the points.</summary>
    public double DigestSeconds => Interlocked.Read(ref _digestTicks) / (double)System.Diagnostics.Stopwatch.Frequency;

    public ScanPointResult Solve(ScanPoint point, ScanPointResult? warmStart, CancellationToken ct)
    {
        var model = Bind(point);
        int groups = model.ShellGroups().Count;
        var settings = new SolverSettings
        {
            Temperature = point.TemperatureK / model.Unit.Kelvins(),
            Mesh = Settings.Mesh, Shifted = Settings.Shifted, Tolerance = Settings.Tolerance,
            MaxIterations = Settings.MaxIterations,
            InitialGuess = ColdOnly ? null : WarmStart(warmStart, groups),
        };
        if (!_reuse.TryTake(out var reuse)) reuse = new SolveReuse();
        SaddlePoint sp;
        try
        {
            var solver = new SaddlePointSolver(model, settings, reuse);
            sp = solver.Solve(ct);
            Record(solver, sp);
            if (!sp.Converged && sp.Groups.All(g => g.R < CollapsingR) && solver.Decoupled() is { } decoupled)
                sp = decoupled with { Iterations = sp.Iterations }; // heading to r = 0, which always solves the equations
        }
        finally { _reuse.Add(reuse); }

        // The same handle and digest `solve` and `nodes` use; the row's mu is the solution's (placed at a node energy at T = 0).
        var solution = sp.Converged ? Solutions.Solution.FromSaddlePoint(model, sp, settings) : null;
        var request = new Analysis.SpectrumRequest { Dos = Columns.Dos || Columns.Heat, Heat = Columns.Heat };
        long digestStart = System.Diagnostics.Stopwatch.GetTimestamp();
        var spectrum = solution is null ? new Analysis.SpectrumColumns() : Analysis.SpectrumSummary.Compute(solution, request).Columns;
        Interlocked.Add(ref _digestTicks, System.Diagnostics.Stopwatch.GetTimestamp() - digestStart);
        return new ScanPointResult
        {
            Converged = sp.Converged, Iterations = sp.Iterations, ResidualNorm = sp.ResidualNorm, Mu = solution?.Mu ?? sp.Mu,
            FreeEnergy = sp.FreeEnergy,
            Groups = sp.Groups.Select(g => new GroupSolution(g.Name, g.R, g.Lambda, g.FOccupation)).ToArray(),
            Parameters = model.Parameters,
            Spectrum = spectrum,
            Error = sp.Converged ? null : string.Join(" ", sp.Notes),
            SolverState = sp.Amplitudes.Pack(),
        };
    }

    /// <summary>
    /// Amplitudes of a neighbouring solution when they can seed this one: same group count and a coherent (r &gt; 0)
    /// solution; a decoupled neighbour (r = 0) carries no information about the Kondo branch.
    /// </summary>
    public static MeanFieldAmplitudes? WarmStart(ScanPointResult? neighbour, int groups)
    {
        if (neighbour?.SolverState is not { } state || state.Length != 2 * groups || !neighbour.Converged) return null;
        for (int g = 0; g < groups; g++) if (!(state[g] > 1e-4) || !double.IsFinite(state[groups + g])) return null;
        return MeanFieldAmplitudes.Unpack(state);
    }

    private void Record(SaddlePointSolver solver, SaddlePoint sp)
    {
        Interlocked.Add(ref _passes, sp.ZonePasses);
        Interlocked.Increment(ref _solves);
        Interlocked.Add(ref _iterations, sp.Iterations);
        if (solver.StateSum is MeshStateSum mesh)
            Interlocked.Add(ref _diagonalisationTicks, (long)(mesh.DiagonalisationSeconds * TimeSpan.TicksPerSecond));
    }
}
