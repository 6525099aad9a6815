using System.Diagnostics;
using System.Globalization;

namespace Meanfield.Scans;

/// <summary>
/// A lock file beside a scan output ("out.parquet.lock") that keeps two processes from writing the same output: it
/// names its holder (host, process id, process start time, UTC) and is removed when the holder disposes it. A lock of
/// this host whose process is gone (or whose id now belongs to a process started later) is stale and taken over with a
/// notice; a live holder, or one on another host (which cannot be checked from here), is refused.
/// </summary>
public sealed class OutputLock : IDisposable
{
    /// <summary>The lock file.</summary>
    public string Path { get; }
    private bool _released;

    private OutputLock(string path) { Path = path; }

    /// <summary>The lock file of an output path.</summary>
    public static string PathFor(string output) => output + ".lock";

    /// <summary>The holder this process writes: host, pid and the process start time.</summary>
    public static (string Host, int Pid, DateTime Started) Self()
    {
        using var p = Process.GetCurrentProcess();
        return (Environment.MachineName, Environment.ProcessId, p.StartTime.ToUniversalTime());
    }

    /// <summary>Takes the lock of <paramref name="output"/>, or refuses.</summary>
    /// <param name="notice">Told when a stale lock is taken over.</param>
    /// <exception cref="ScanError">Another live process holds it (the message names it), or the lock file is unreadable.</exception>
    public static OutputLock Acquire(string output, Action<string>? notice)
    {
        var path = PathFor(output);
        for (int attempt = 0; attempt < 3; attempt++)
        {
            if (TryCreate(path)) return new OutputLock(path);
            var holder = Read(path);
            if (holder is null) continue; // removed between our attempt and the read: try again
            var (host, pid, started) = holder.Value;
            string who = string.Create(CultureInfo.InvariantCulture, $"host {host}, process {pid}, started {started:yyyy-MM-ddTHH:mm:ssZ}");
            if (host != Environment.MachineName)
                throw new ScanError($"{output} is being written by another process ({who}; lock file {path}); if that run is over, delete the lock file");
            if (IsAlive(pid, started))
                throw new ScanError($"{output} is being written by another process ({who}; lock file {path}); wait for it to finish or stop it");
            File.Delete(path);
            notice?.Invoke($"took over the stale lock {path} ({who} is no longer running)");
        }
        throw new ScanError($"{path}: could not take the lock (another process keeps creating it)");
    }

    private static bool TryCreate(string path)
    {
        try
        {
            using var s = new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.None);
            using var w = new StreamWriter(s);
            var (host, pid, started) = Self();
            w.Write(string.Create(CultureInfo.InvariantCulture, $"# meanfield scan output lock\nhost = {host}\npid = {pid}\nstarted = {started:yyyy-MM-ddTHH:mm:ss.fffZ}\n"));
            return true;
        }
        catch (IOException) when (File.Exists(path)) { return false; }
    }

    /// <summary>The holder named in a lock file; null when the file is gone.</summary>
    /// <exception cref="ScanError">The file does not name a holder.</exception>
    public static (string Host, int Pid, DateTime Started)? Read(string path)
    {
        string[] lines;
        try { lines = File.ReadAllLines(path); }
        catch (FileNotFoundException) { return null; }
        var values = lines.Where(l => l.Contains(" = ")).Select(l => l.Split(" = ", 2)).ToDictionary(p => p[0].Trim(), p => p[1].Trim());
        if (values.TryGetValue("host", out var host) && values.TryGetValue("pid", out var pidText)
            && int.TryParse(pidText, NumberStyles.None, CultureInfo.InvariantCulture, out int pid)
            && values.TryGetValue("started", out var startText)
            && DateTime.TryParse(startText, CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal, out var started))
            return (host, pid, started);
        throw new ScanError($"{path}: a lock file that names no holder (host, pid, started); if no scan is writing this output, delete it");
    }

    /// <summary>Whether process <paramref name="pid"/> of this host runs and is the one started at <paramref name="started"/>.</summary>
    public static bool IsAlive(int pid, DateTime started)
    {
        try
        {
            using var p = Process.GetProcessById(pid);
            if (p.HasExited) return false;
            // A reused id belongs to a process started later than the holder (start times agree to clock ticks).
            return Math.Abs((p.StartTime.ToUniversalTime() - started).TotalSeconds) < 1;
        }
        catch (ArgumentException) { return false; }
        catch (InvalidOperationException) { return false; }
    }

    /// <summary>Removes the lock file.</summary>
    public void Dispose()
    {
        if (_released) return;
        _released = true;
        try { File.Delete(Path); } catch (IOException) { }
    }
}
