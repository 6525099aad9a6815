using System.CommandLine;
using Meanfield.Models;

namespace Meanfield.Cli;

/// <summary>Runs a command and turns every known failure into one line on stderr and a documented exit code.</summary>
public static class Runner
{
    public static int Run(RootCommand root, string[] args, TextWriter? stdout = null, TextWriter? stderr = null)
    {
        var output = stdout ?? Console.Out;
        var error = stderr ?? Console.Error;
        try
        {
            var config = new InvocationConfiguration { Output = output, Error = error, EnableDefaultExceptionHandler = false };
            return root.Parse(args).Invoke(config);
        }
        catch (ModelError e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (UserInputException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (InvalidDataException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (FileNotFoundException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (DirectoryNotFoundException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (ArgumentException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.BadInput; }
        catch (NoAnswerException e) { error.WriteLine($"no answer: {e.Message}"); return ExitCodes.NoAnswer; }
        catch (NotConvergedException e) { error.WriteLine($"error: {e.Message}"); return ExitCodes.NotConverged; }
        catch (OperationCanceledException) { error.WriteLine("cancelled"); return 130; }
        catch (Exception e)
        {
            error.WriteLine($"internal error (please report it with the command line): {e}");
            return ExitCodes.Internal;
        }
    }
}
