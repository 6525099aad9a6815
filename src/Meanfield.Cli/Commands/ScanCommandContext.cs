using System.Collections;
using Meanfield.Scans;

namespace Meanfield.Cli.Commands;

/// <summary>What the scan command reads from outside the command line; tests replace it.</summary>
/// <param name="Environment">Environment variables (Slurm array variables are read from here).</param>
/// <param name="Cancellation">Extra cancellation besides Ctrl-C.</param>
/// <param name="OnProgress">Called on every finished point (after the display is updated).</param>
public sealed record ScanCommandContext(Func<IDictionary> Environment, CancellationToken Cancellation = default,
                                        Action<ScanProgress>? OnProgress = null)
{
    public static ScanCommandContext Process => new(System.Environment.GetEnvironmentVariables);
}
