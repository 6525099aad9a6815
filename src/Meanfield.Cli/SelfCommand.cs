using System.Globalization;
using Meanfield.Benchmarks;

namespace Meanfield.Cli;

/// <summary>This program started again as a child process: the whole-process line of `meanfield bench`.</summary>
internal static class SelfCommand
{
    /// <summary>
    /// Times `meanfield solve MODEL --mesh M [--temperature T] --out (scratch file)` <paramref name="runs"/> times as
    /// fresh processes of this same program: the published binary when run as one, `dotnet Meanfield.Cli.dll` when run
    /// through the dotnet host. The scratch directory is removed afterwards.
    /// </summary>
    public static ProcessTiming TimeSolve(string model, int mesh, string? temperature, int runs, CancellationToken ct)
    {
        var scratch = Directory.CreateTempSubdirectory("mf-bench-process-");
        try
        {
            var (executable, prefix) = Invocation();
            List<string> args = [.. prefix, "solve", model, "--mesh", mesh.ToString(CultureInfo.InvariantCulture)];
            if (temperature is not null) args.AddRange(["--temperature", temperature]);
            args.AddRange(["--out", Path.Combine(scratch.FullName, "solution.json")]);
            string shown = $"meanfield solve {model} --mesh {mesh}" + (temperature is null ? "" : $" --temperature {temperature}");
            return ProcessBenchmark.Run(executable, args, runs, shown, ct);
        }
        finally { scratch.Delete(recursive: true); }
    }

    // The published apphost is the program itself. Anywhere else (dotnet Meanfield.Cli.dll, a test host) the dotnet
    // host runs the CLI assembly: the one this process runs under, or the SDK's (DOTNET_HOST_PATH), or dotnet on PATH.
    private static (string Executable, string[] Prefix) Invocation()
    {
        string? path = Environment.ProcessPath;
        string name = Path.GetFileNameWithoutExtension(path ?? "");
        if (path is not null && (name == "meanfield" || name == typeof(SelfCommand).Assembly.GetName().Name)) return (path, []);
        string host = name == "dotnet" ? path! : Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } h ? h : "dotnet";
        return (host, [typeof(SelfCommand).Assembly.Location]);
    }
}
