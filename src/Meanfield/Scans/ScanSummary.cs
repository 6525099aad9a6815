namespace Meanfield.Scans;

/// <summary>What a finished scan run did.</summary>
/// <param name="OutputPath">The final Parquet file.</param>
/// <param name="Total">Points in the shard.</param>
/// <param name="Solved">Points solved in this run.</param>
/// <param name="Resumed">Points recovered from chunk files of an earlier run.</param>
/// <param name="NonConverged">Rows with converged = false.</param>
/// <param name="Elapsed">Wall time of this run.</param>
public sealed record ScanSummary(string OutputPath, int Total, int Solved, int Resumed, int NonConverged, TimeSpan Elapsed)
{
    /// <summary>Rows whose solve threw (a subset of <see cref="NonConverged"/>), with their error text in the "error" column.</summary>
    public int Failed { get; init; }
}
