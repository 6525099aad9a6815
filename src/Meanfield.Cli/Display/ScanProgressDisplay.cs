using System.Globalization;
using Meanfield.Scans;
using Spectre.Console;

namespace Meanfield.Cli.Display;

/// <summary>
/// Shows a scan's progress: a live bar on an interactive terminal, one plain line every few seconds otherwise (logs
/// and batch jobs get no escape codes).
/// </summary>
public static class ScanProgressDisplay
{
    /// <summary>Time between two plain progress lines.</summary>
    public static readonly TimeSpan PlainInterval = TimeSpan.FromSeconds(5);

    /// <summary>Runs <paramref name="run"/> with a progress sink suited to <paramref name="o"/>.</summary>
    /// <param name="o">Where the command prints; a live bar only when it is the console and the console is a terminal.</param>
    /// <param name="points">Points the run will finish.</param>
    /// <param name="hook">Called after every finished point (tests use it), or null.</param>
    /// <param name="run">The run, given the progress sink.</param>
    public static async Task<T> RunAsync<T>(TextWriter o, int points, Action<ScanProgress>? hook, Func<IProgress<ScanProgress>, Task<T>> run)
    {
        bool terminal = ReferenceEquals(o, Console.Out) && !Console.IsOutputRedirected;
        if (!terminal) return await run(new PlainLines(o, PlainInterval, hook));
        return await AnsiConsole.Progress()
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(),
                     new ElapsedTimeColumn(), new RemainingTimeColumn(), new SpinnerColumn())
            .StartAsync(async display =>
            {
                var task = display.AddTask("solving", maxValue: points);
                return await run(new Bar(task, hook));
            });
    }

    private sealed class Bar(ProgressTask task, Action<ScanProgress>? hook) : IProgress<ScanProgress>
    {
        public void Report(ScanProgress p)
        {
            task.Value = p.Done;
            task.Description = p.NonConverged > 0 ? $"solving ({p.NonConverged} not converged)" : "solving";
            hook?.Invoke(p);
        }
    }

    private sealed class PlainLines(TextWriter o, TimeSpan every, Action<ScanProgress>? hook) : IProgress<ScanProgress>
    {
        private readonly Lock _gate = new();
        private DateTime _last = DateTime.UtcNow;

        public void Report(ScanProgress p)
        {
            lock (_gate)
            {
                if (DateTime.UtcNow - _last >= every && p.Done < p.Total)
                {
                    _last = DateTime.UtcNow;
                    string eta = p.Remaining is { } r ? $", about {Clock(r)} left" : "";
                    o.WriteLine(string.Create(CultureInfo.InvariantCulture,
                        $"  {p.Done}/{p.Total} points ({100 * p.Fraction:F0}%), {p.NonConverged} not converged, {Clock(p.Elapsed)} elapsed{eta}"));
                }
            }
            hook?.Invoke(p);
        }

        private static string Clock(TimeSpan t) => t.TotalHours >= 1 ? t.ToString(@"h\:mm\:ss", CultureInfo.InvariantCulture) : t.ToString(@"m\:ss", CultureInfo.InvariantCulture);
    }
}
