namespace Meanfield.Scans;

/// <summary>
/// Everything a scan records about one solved point: a flat set of columns plus the solver's warm-start payload.
/// Energies are in the model's energy unit; optional columns are null where not computed.
/// </summary>
public sealed record ScanPointResult
{
    public required bool Converged { get; init; }
    public int Iterations { get; init; }
    /// <summary>Norm of the saddle-point residual vector at exit (model energy unit / electrons, mixed).</summary>
    public double ResidualNorm { get; init; } = double.NaN;
    /// <summary>Chemical potential mu.</summary>
    public double Mu { get; init; } = double.NaN;
    /// <summary>Mean-field free energy per cell F.</summary>
    public double FreeEnergy { get; init; } = double.NaN;
    /// <summary>Per correlated group (r, lambda, n_f), in model order.</summary>
    public IReadOnlyList<GroupSolution> Groups { get; init; } = [];
    /// <summary>Bound parameter values actually used (name to value); the scan falls back to numeric overrides.</summary>
    public IReadOnlyList<KeyValuePair<string, double>> Parameters { get; init; } = [];
    /// <summary>
    /// The spectrum digest's columns (phase label, gaps, DOS at mu, nodes, heat coefficients): the same record the
    /// solution JSON writes (<see cref="Analysis.SpectrumColumns"/>); empty for points that did not converge.
    /// </summary>
    public Analysis.SpectrumColumns Spectrum { get; init; } = new();
    /// <summary>Why the point failed, when the solver threw or did not converge; null otherwise.</summary>
    public string? Error { get; init; }
    /// <summary>Solver-private state for warm starts (for example r, lambda, mu); kept in chunk files for resume.</summary>
    public double[]? SolverState { get; init; }
}
