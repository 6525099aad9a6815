namespace Meanfield.Scans;

/// <summary>Progress of a running scan (points of this shard).</summary>
/// <param name="Done">Points finished, including those recovered from earlier runs on resume.</param>
/// <param name="Total">Points in this shard.</param>
/// <param name="NonConverged">Finished points whose solve did not converge.</param>
/// <param name="Elapsed">Wall time since this run started.</param>
/// <param name="Remaining">Estimated time to finish, from this run's rate; null before the first point.</param>
/// <param name="LastPointId">Id of the point that just finished.</param>
public sealed record ScanProgress(int Done, int Total, int NonConverged, TimeSpan Elapsed, TimeSpan? Remaining, int LastPointId)
{
    public double Fraction => Total == 0 ? 1 : (double)Done / Total;
}
