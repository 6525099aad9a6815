namespace Meanfield.Output;

/// <summary>
/// Writes a file through a temporary sibling and renames it into place, so a reader never sees a partial file and a
/// failed write leaves nothing behind (a truncated Parquet file is unreadable as a whole).
/// </summary>
public static class AtomicFile
{
    /// <summary>The output name that means "standard output" (common practice of command-line tools).</summary>
    public const string StandardOutputName = "-";

    private static readonly AsyncLocal<Func<Stream>?> Sink = new();

    /// <summary>
    /// Where <see cref="StandardOutputName"/> writes, set by the host for the current asynchronous flow (the command
    /// line sets its standard output); null (the default) refuses "-". The stream returned is flushed, not closed.
    /// </summary>
    public static Func<Stream>? StandardOutput { get => Sink.Value; set => Sink.Value = value; }

    /// <summary>True when <paramref name="path"/> names standard output.</summary>
    public static bool IsStandardOutput(string? path) => path == StandardOutputName;

    /// <summary>Runs <paramref name="write"/> on a temporary file in the target's folder, then moves it onto <paramref name="path"/>.</summary>
    /// <exception cref="DirectoryNotFoundException">The target's folder does not exist.</exception>
    /// <exception cref="OutputPathException">The file cannot be created, written or renamed into place; the message
    /// names the target, never the temporary sibling.</exception>
    public static async Task WriteAsync(string path, Func<Stream, Task> write)
    {
        if (IsStandardOutput(path))
        {
            var open = StandardOutput ?? throw new OutputPathException("'-' (standard output) is not available here; give a file name");
            var output = open();
            // A writer that disposes the stream (StreamWriter, Parquet) must not close standard output.
            await write(new KeepOpenStream(output));
            await output.FlushAsync();
            return;
        }
        var full = Path.GetFullPath(path);
        var dir = Path.GetDirectoryName(full) ?? ".";
        if (!Directory.Exists(dir)) throw new DirectoryNotFoundException($"Output folder '{dir}' of '{path}' does not exist.");
        var tmp = TemporarySibling(full);
        try
        {
            await using (var stream = Create(tmp, path, dir))
                await write(stream);
            File.Move(tmp, full, overwrite: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw CannotWrite(path, dir, tmp, e);
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

    /// <summary>A hidden, unique sibling of <paramref name="fullPath"/> in the same folder (so the rename is atomic).</summary>
    public static string TemporarySibling(string fullPath) =>
        Path.Combine(Path.GetDirectoryName(fullPath) ?? ".", $".{Path.GetFileName(fullPath)}.{Guid.NewGuid():N}.tmp");

    /// <summary>The failure to write <paramref name="path"/>, in words that name it rather than the temporary file.</summary>
    public static OutputPathException CannotWrite(string path, string folder, string temporary, Exception e)
    {
        string why = e switch
        {
            UnauthorizedAccessException => $"permission denied in {folder}",
            FileNotFoundException or DirectoryNotFoundException => $"{folder} does not accept new files",
            _ when Directory.Exists(path) => "it is a folder; give a file name inside it",
            _ => e.Message.Replace(temporary, path, StringComparison.Ordinal),
        };
        return new OutputPathException($"cannot write {path}: {why}; nothing was written", e);
    }

    private static FileStream Create(string tmp, string path, string dir)
    {
        try { return new FileStream(tmp, FileMode.CreateNew, FileAccess.Write, FileShare.None); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { throw CannotWrite(path, dir, tmp, e); }
    }

    /// <summary>Passes writes through and ignores Dispose, so standard output stays open for later lines.</summary>
    private sealed class KeepOpenStream(Stream inner) : WriteOnlyStream
    {
        public override void Flush() => inner.Flush();
        public override void Write(ReadOnlySpan<byte> buffer) => inner.Write(buffer);
        protected override void Dispose(bool disposing) { if (disposing) inner.Flush(); }
    }
}
