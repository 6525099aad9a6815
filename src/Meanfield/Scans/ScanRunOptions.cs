namespace Meanfield.Scans;

/// <summary>How a scan run visits, checkpoints and resumes.</summary>
public sealed record ScanRunOptions
{
    /// <summary>Slice of the grid to compute.</summary>
    public ShardSpec Shard { get; init; } = ShardSpec.Whole;
    /// <summary>Reuse the chunk files of an interrupted run and skip their points.</summary>
    public bool Resume { get; init; }
    /// <summary>
    /// Snake segments solved at once. 1 (default) leaves the cores to the solver, which parallelises over k; 2 or more
    /// split the shard's snake into that many contiguous runs, each with its own warm-start chain.
    /// </summary>
    public int DegreeOfParallelism { get; init; } = 1;
    /// <summary>Write a chunk after this many finished points...</summary>
    public int FlushEveryPoints { get; init; } = 16;
    /// <summary>...or when this much time has passed since the last chunk.</summary>
    public TimeSpan FlushInterval { get; init; } = TimeSpan.FromSeconds(30);
    /// <summary>When a warm-started solve does not converge, solve again from a cold start.</summary>
    public bool RetryColdOnFailure { get; init; } = true;
    /// <summary>
    /// Told, in one line each, what the run did on its own that the user should know: a point whose solve threw
    /// (written with converged = false and the error), a damaged chunk set aside, leftovers of a finished run removed.
    /// Called from the solving threads; null to ignore.
    /// </summary>
    public Action<string>? Notice { get; init; }
}
