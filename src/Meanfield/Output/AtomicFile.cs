namespace Meanfield.Output;

/// <summary>
/// Writes a file through a temporary sibling and an atomic rename, so a crash or an error never leaves a partial
/// output under the final name.
/// </summary>
public static class AtomicFile
{
    public static void Write(string path, Action<Stream> write)
    {
        var full = Path.GetFullPath(path);
        var dir = Path.GetDirectoryName(full)!;
        Directory.CreateDirectory(dir);
        var temp = Path.Combine(dir, $".{Path.GetFileName(full)}.{Environment.ProcessId}.tmp");
        try
        {
            using (var stream = new FileStream(temp, FileMode.Create, FileAccess.Write, FileShare.None))
                write(stream);
            File.Move(temp, full, overwrite: true);
        }
        finally
        {
            if (File.Exists(temp)) File.Delete(temp);
        }
    }

    public static void WriteText(string path, string text) =>
        Write(path, s => { using var w = new StreamWriter(s, new System.Text.UTF8Encoding(false)); w.Write(text); });
}
