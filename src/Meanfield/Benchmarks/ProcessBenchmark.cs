using System.Diagnostics;
using System.Globalization;

namespace Meanfield.Benchmarks;

/// <summary>Wall times of one command run again and again as a fresh process: start-up, JIT and the work together.</summary>
/// <param name="Description">What was run, for the report (the command line as a user would type it).</param>
/// <param name="Seconds">Wall time of each run from process start to exit (s), in the order they ran.</param>
/// <param name="ExitCode">Exit code of the first run that did not exit 0, else 0.</param>
public sealed record ProcessTiming(string Description, IReadOnlyList<double> Seconds, int ExitCode)
{
    /// <summary>Median wall time (s); the mean of the two middle runs for an even count.</summary>
    public double MedianSeconds
    {
        get
        {
            var sorted = Seconds.Order().ToArray();
            int n = sorted.Length;
            return n == 0 ? 0 : n % 2 == 1 ? sorted[n / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
        }
    }

    /// <summary>One line of the benchmark report: median, fastest and slowest run, and a failed exit code if any.</summary>
    public string Describe()
    {
        string failed = ExitCode == 0 ? "" : $"; a run exited {ExitCode}, so these times are not of a finished solve";
        return string.Create(CultureInfo.InvariantCulture,
            $"whole process: `{Description}`, {Seconds.Count} runs: median {MedianSeconds:F3} s (fastest {Seconds.Min():F3} s, slowest {Seconds.Max():F3} s){failed}");
    }
}

/// <summary>
/// Times a command as separate processes (library side of the whole-process line of `meanfield bench`): what a user
/// or a job script waits for, which in-process timings miss (runtime start-up, loading, first-call compilation).
/// </summary>
public static class ProcessBenchmark
{
    /// <summary>
    /// Runs <paramref name="executable"/> with <paramref name="arguments"/> <paramref name="runs"/> times, one after the
    /// other, with standard output and error read and dropped, and returns the wall time of each run.
    /// </summary>
    /// <param name="executable">Program to start (a path, or a name looked up on PATH).</param>
    /// <param name="arguments">Its arguments, passed as they are (no shell).</param>
    /// <param name="runs">Number of runs, 1 to 1000.</param>
    /// <param name="description">The command line shown in the report.</param>
    /// <param name="cancellation">Stops between runs.</param>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="runs"/> is outside 1..1000.</exception>
    /// <exception cref="System.ComponentModel.Win32Exception">The program cannot be started.</exception>
    /// <exception cref="InvalidOperationException">The start returned no process.</exception>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static ProcessTiming Run(string executable, IReadOnlyList<string> arguments, int runs, string description,
                                    CancellationToken cancellation = default)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(runs, 1);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(runs, 1000);
        var seconds = new List<double>(runs);
        int exit = 0;
        for (int i = 0; i < runs; i++)
        {
            cancellation.ThrowIfCancellationRequested();
            var start = new ProcessStartInfo(executable)
            {
                RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false,
            };
            foreach (var a in arguments) start.ArgumentList.Add(a);
            var clock = Stopwatch.StartNew();
            using var process = Process.Start(start) ?? throw new InvalidOperationException($"{executable} did not start");
            // Read both streams to the end so that a chatty child never blocks on a full pipe.
            var output = process.StandardOutput.ReadToEndAsync(cancellation);
            var error = process.StandardError.ReadToEndAsync(cancellation);
            process.WaitForExit();
            seconds.Add(clock.Elapsed.TotalSeconds);
            Task.WaitAll(output, error);
            if (process.ExitCode != 0 && exit == 0) exit = process.ExitCode;
        }
        return new ProcessTiming(description, seconds, exit);
    }
}
