namespace Meanfield.Output;

/// <summary>
/// The one check every command that writes runs before it computes anything: each output path must name a file (not a
/// folder) in an existing folder, and must not resolve, after following symbolic links, to one of the command's
/// inputs. A refused output is an <see cref="OutputPathException"/> and nothing is touched.
/// </summary>
/// <remarks>
/// Hard links (two names of one inode) are not detected: .NET exposes no inode number, and a second hard link to an
/// input is rare enough that we leave it (the atomic rename then replaces that name only, never the other).
/// </remarks>
public static class OutputGuard
{
    /// <summary>Symbolic links followed before giving up (the limit Linux applies to path resolution).</summary>
    public const int MaxLinkHops = 40;

    /// <summary>Checks one output path against the inputs (null or empty inputs are ignored).</summary>
    /// <param name="output">The output path as given.</param>
    /// <param name="inputs">Every file the command reads.</param>
    /// <param name="option">The option that named the output, for the message (default "--out").</param>
    /// <exception cref="OutputPathException">The output is empty, a folder, in a missing folder, or an input.</exception>
    public static void Check(string output, IEnumerable<string?> inputs, string option = "--out") =>
        Check([output], inputs, option);

    /// <summary>
    /// Checks several outputs of one command (a table and the picture written next to it, say) against its inputs.
    /// The first output is the one the user named; the others are derived from it and named as such in the message.
    /// </summary>
    /// <exception cref="OutputPathException">An output is empty, a folder, in a missing folder, or an input.</exception>
    public static void Check(IReadOnlyList<string> outputs, IEnumerable<string?> inputs, string option = "--out")
    {
        if (outputs.Count == 0) return;
        string named = outputs[0];
        var resolvedInputs = inputs.Where(i => !string.IsNullOrWhiteSpace(i)).Select(i => (Given: i!, Real: Resolve(i!))).ToList();
        foreach (var output in outputs)
        {
            string what = output == named ? $"{option} {named}" : $"{option} {named}: the file {output} written next to it";
            if (string.IsNullOrWhiteSpace(output)) throw new OutputPathException($"{option}: empty file name");
            if (Directory.Exists(output) || output.EndsWith('/') || output.EndsWith(Path.DirectorySeparatorChar))
                throw new OutputPathException($"{what}: is a folder; give a file name inside it");
            var full = Path.GetFullPath(output);
            var dir = Path.GetDirectoryName(full);
            if (dir is not null && !Directory.Exists(dir))
                throw new OutputPathException($"{what}: the folder {dir} does not exist");
            var real = Resolve(output);
            foreach (var (given, input) in resolvedInputs)
                if (string.Equals(real, input, StringComparison.Ordinal))
                    throw new OutputPathException(
                        $"{what}: is the input {given}{(real != Path.GetFullPath(given) || real != full ? $" (both resolve to {real})" : "")}; " +
                        "refusing to overwrite an input: choose another output name");
        }
    }

    /// <summary>
    /// The absolute path with every symbolic link on the way (folders and the file itself) followed; a path that does
    /// not exist yet keeps its last parts as written.
    /// </summary>
    public static string Resolve(string path)
    {
        var current = Path.GetFullPath(path);
        for (int hop = 0; hop < MaxLinkHops; hop++)
        {
            var dir = Path.GetDirectoryName(current);
            if (dir is not null) current = Path.Combine(ResolveFolder(dir, 0), Path.GetFileName(current));
            string? target = LinkTarget(current);
            if (target is null) return current;
            current = Path.GetFullPath(target, Path.GetDirectoryName(current) ?? "/");
        }
        return current;
    }

    /// <summary>"the file of that name is from an earlier run" when <paramref name="path"/> exists, for failure messages.</summary>
    public static string NotWrittenNote(string path)
    {
        if (!File.Exists(path)) return $"{path} was not written";
        var when = File.GetLastWriteTimeUtc(path).ToString("yyyy-MM-dd HH:mm:ss", System.Globalization.CultureInfo.InvariantCulture);
        return $"{path} was not written; the file of that name beside it is from an earlier run (last written {when} UTC) and does not hold this result";
    }

    private static string ResolveFolder(string folder, int depth)
    {
        var parent = Path.GetDirectoryName(folder);
        if (parent is null || depth > MaxLinkHops) return folder;
        var current = Path.Combine(ResolveFolder(parent, depth + 1), Path.GetFileName(folder));
        string? target = LinkTarget(current);
        return target is null ? current : ResolveFolder(Path.GetFullPath(target, Path.GetDirectoryName(current) ?? "/"), depth + 1);
    }

    // The immediate target of a symbolic link (relative targets stay relative to the link's folder), or null.
    private static string? LinkTarget(string path)
    {
        try
        {
            FileSystemInfo info = Directory.Exists(path) ? new DirectoryInfo(path) : new FileInfo(path);
            return info.LinkTarget;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return null; }
    }
}

/// <summary>An output path that cannot be used: a folder, a missing folder, an input of the command, or unwritable.</summary>
public sealed class OutputPathException(string message, Exception? inner = null) : InputException(message, inner);
