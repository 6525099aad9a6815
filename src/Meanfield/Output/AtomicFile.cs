namespace Meanfield.Output;

/// <summary>
/// Writes a file through a temporary sibling and renames it into place, so a reader never sees a partial file and a
/// failed write leaves nothing behind (a truncated Parquet file is unreadable as a whole).
/// </summary>
public static class AtomicFile
{
    /// <summary>Runs <paramref name="write"/> on a temporary file in the target's folder, then moves it onto <paramref name="path"/>.</summary>
    public static async Task WriteAsync(string path, Func<Stream, Task> write)
    {
        var full = Path.GetFullPath(path);
        var dir = Path.GetDirectoryName(full) ?? ".";
        if (!Directory.Exists(dir)) throw new DirectoryNotFoundException($"Output folder '{dir}' of '{path}' does not exist.");
        var tmp = Path.Combine(dir, $".{Path.GetFileName(full)}.{Guid.NewGuid():N}.tmp");
        try
        {
            await using (var stream = new FileStream(tmp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
                await write(stream);
            File.Move(tmp, full, overwrite: true);
        }
        finally
        {
            if (File.Exists(tmp)) File.Delete(tmp);
        }
    }

    /// <summary>Synchronous form of <see cref="WriteAsync"/>.</summary>
    public static void Write(string path, Action<Stream> write) =>
        WriteAsync(path, s => { write(s); return Task.CompletedTask; }).GetAwaiter().GetResult();

    /// <summary>Writes UTF-8 text (no byte-order mark) atomically.</summary>
    public static void WriteText(string path, string text) =>
        Write(path, s => { using var w = new StreamWriter(s, new System.Text.UTF8Encoding(false)); w.Write(text); });
}
