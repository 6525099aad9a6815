using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

/// <summary>Runs the `meanfield` command tree in-process and captures what it prints.</summary>
internal static class CliRun
{
    public static (int Code, string Out, string Err) Run(params string[] args)
    {
        var o = new StringWriter(); var e = new StringWriter();
        int code = Runner.Run(CommandTree.Build(), args, o, e);
        return (code, o.ToString(), e.ToString());
    }

    /// <summary>The repository's models/ folder, found upwards from the test binaries.</summary>
    public static string ModelPath(string file)
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !Directory.Exists(Path.Combine(dir.FullName, "models"))) dir = dir.Parent;
        return Path.Combine(dir?.FullName ?? throw new DirectoryNotFoundException("models/ not found"), "models", file);
    }

    public static string TempDir()
    {
        var d = Path.Combine(Path.GetTempPath(), "meanfield-tests-" + Guid.NewGuid().ToString("N")[..8]);
        Directory.CreateDirectory(d);
        return d;
    }
}
