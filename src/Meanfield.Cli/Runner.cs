using System.CommandLine;
using Meanfield.Models;

namespace Meanfield.Cli;

/// <summary>
/// Runs a command and turns every known failure into one line on stderr and a documented exit code: an
/// <see cref="InputException"/> (or an unreadable, missing file) is bad input (2); anything else, ArgumentException
/// included, is an internal error (70).
/// </summary>
public static class Runner
{
    public static int Run(RootCommand root, string[] args, TextWriter? stdout = null, TextWriter? stderr = null)
    {
        var output = stdout ?? Console.Out;
        var error = stderr ?? Console.Error;
        // `--out -` writes to this run's standard output: the process's own, or the captured writer of a test or host.
        Output.AtomicFile.StandardOutput = ReferenceEquals(output, Console.Out) ? Console.OpenStandardOutput : () => new Display.TextWriterStream(output);
        try
        {
            // The version and the help speak of the program by its command name and its one version string.
            if (args is ["--version"]) { output.WriteLine(Output.Provenance.ToolVersion); return ExitCodes.Success; }
            bool help = args.Any(a => a is "-h" or "--help" or "-?" or "/?" or "/h");
            var helpText = help ? new StringWriter() : null;
            var config = new InvocationConfiguration { Output = helpText ?? output, Error = error, EnableDefaultExceptionHandler = false };
            var parse = root.Parse(args);
            if (parse.Errors.Count > 0)
            {
                foreach (var e in parse.Errors) error.WriteLine($"error: {Readable(e.Message)}");
                var names = new List<string>();
                for (var c = parse.CommandResult; c is not null; c = c.Parent as System.CommandLine.Parsing.CommandResult)
                    if (c.Command is not RootCommand) names.Insert(0, c.Command.Name);
                error.WriteLine($"see `meanfield {string.Join(" ", names)}{(names.Count > 0 ? " " : "")}--help` for the options");
                // A value the parser could not convert is bad input (2); an unknown option or a missing argument is usage (1).
                return parse.Errors.All(e => e.Message.StartsWith("Cannot parse argument", StringComparison.Ordinal)) ? ExitCodes.BadInput : ExitCodes.Usage;
            }
            int code = parse.Invoke(config);
            // The usage lines start with the name the runtime gives the root (the assembly or test host): say `meanfield`.
            if (helpText is not null) output.Write(helpText.ToString().Replace($"  {root.Name} ", "  meanfield "));
            return code;
        }
        catch (InputException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (InvalidDataException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (FileNotFoundException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (DirectoryNotFoundException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (NoAnswerException e) { error.WriteLine($"no answer: {e.Message}"); return ExitCodes.NoAnswer; }
        catch (NotConvergedException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.NotConverged; }
        catch (OperationCanceledException) { error.WriteLine("cancelled"); return 130; }
        catch (Exception e)
        {
            // ArgumentException included: a library precondition our own code violated is a bug, not bad input
            // (what the user gave is reported as an InputException).
            error.WriteLine($"internal error (please report it with the command line): {e}");
            return ExitCodes.Internal;
        }
    }

    /// <summary>A parse error with .NET type names ("System.Nullable`1[System.Int32]") said in words.</summary>
    internal static string Readable(string message) =>
        System.Text.RegularExpressions.Regex.Replace(message,
            @" as expected type '(?:System\.Nullable`1\[)?System\.(\w+)\]?'", m => ": expected " + m.Groups[1].Value switch
            {
                "Int32" or "Int64" => "a whole number",
                "Double" or "Single" or "Decimal" => "a number",
                "Boolean" => "true or false",
                "String" => "text",
                var other => other,
            });
}
