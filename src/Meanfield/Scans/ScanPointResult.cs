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
    public double? DirectGap { get; init; }
    public double? IndirectGap { get; init; }
    /// <summary>Total DOS at the chemical potential, states per energy unit per cell.</summary>
    public double? DosFermiTotal { get; init; }
    /// <summary>Correlated-orbital DOS at the chemical potential, states per energy unit per cell.</summary>
    public double? DosFermiCorrelated { get; init; }
    public int? NodeCount { get; init; }
    /// <summary>Largest |E_node - mu| over the nodes found.</summary>
    public double? MaxNodeOffset { get; init; }
    public int? NetChirality { get; init; }
    public int? AbsChirality { get; init; }
    /// <summary>Sommerfeld coefficient gamma in mJ mol^-1 K^-2.</summary>
    public double? GammaMilliJoulePerMolK2 { get; init; }
    /// <summary>T^3 coefficient beta in mJ mol^-1 K^-4.</summary>
    public double? BetaMilliJoulePerMolK4 { get; init; }
    /// <summary>Phase label (decoupled, Kondo insulator, Weyl semimetal, ...); null when not classified.</summary>
    public string? Phase { get; init; }
    /// <summary>
    /// Why the point has no solution when its solve threw (bad value at this point, a tie that divides by zero, a
    /// numerical failure): the message, naming the scan file, line and point where it can. Null for a point that was
    /// solved (converged or not). A point with an error always has <see cref="Converged"/> = false.
    /// </summary>
    public string? Error { get; init; }
    /// <summary>Solver-private state for warm starts (for example r, lambda, mu); kept in chunk files for resume.</summary>
    public double[]? SolverState { get; init; }
}
