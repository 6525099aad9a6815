using System.Diagnostics;

namespace Meanfield.Scans;

/// <summary>Counts finished points across segments and reports progress with an ETA from this run's rate.</summary>
internal sealed class ProgressTracker(int total, int resumed, int resumedNonConverged, Stopwatch clock, IProgress<ScanProgress>? sink)
{
    private int _solved, _nonConverged = resumedNonConverged;

    public void Finished(int id, bool converged)
    {
        int solved = Interlocked.Increment(ref _solved);
        int bad = converged ? Volatile.Read(ref _nonConverged) : Interlocked.Increment(ref _nonConverged);
        if (sink is null) return;
        var elapsed = clock.Elapsed;
        int remaining = total - resumed - solved;
        var eta = TimeSpan.FromSeconds(elapsed.TotalSeconds / solved * remaining);
        sink.Report(new ScanProgress(resumed + solved, total, bad, elapsed, eta, id));
    }
}
