using System.CommandLine;
using Meanfield.Output;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield info`: version, linear-algebra backend and machine.</summary>
public static class InfoCommand
{
    public static Command Build()
    {
        var command = new Command("info", "Print the version, the active linear-algebra backend and the machine");
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            o.WriteLine($"meanfield {Provenance.ToolVersion}");
            o.WriteLine($"linear algebra  {Provenance.Backend}");
            o.WriteLine($"runtime         .NET {Environment.Version}, {Environment.ProcessorCount} cores, {System.Runtime.InteropServices.RuntimeInformation.OSDescription}");
            return ExitCodes.Success;
        });
        return command;
    }
}
