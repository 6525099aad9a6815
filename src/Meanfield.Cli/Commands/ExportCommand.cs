using System.CommandLine;
using Meanfield.Output;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield export INPUT --out FILE.json|.csv|.parquet`: the (renormalized) one-body model for other codes.</summary>
public static class ExportCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var command = new Command("export", "Write the one-body model (a solution's renormalized model: r-scaled hybridization, shifted f levels, mu) "
            + "as a table of matrix elements: JSON, CSV or Parquet by the extension of --out") { output };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var outPath = parse.GetValue(output)!;
            var ext = AtomicFile.IsStandardOutput(outPath) ? ".json" : Path.GetExtension(outPath).ToLowerInvariant();
            var o = CommonOptions.Messages(parse, outPath);
            CommonOptions.RefuseOverwrite(parse.GetValue(solution.Input)!, [outPath]);
            if (!ModelExport.Extensions.Contains(ext)) throw new UserInputException($"--out {outPath}: use a .json, .csv or .parquet file name, or - for JSON on standard output");
            var src = solution.Resolve(parse, o);
            var model = ModelExport.Write(src, outPath);
            o.WriteLine(
                $"wrote {(AtomicFile.IsStandardOutput(outPath) ? "standard output" : outPath)} ({model.Elements.Count} matrix elements, {model.Header.Orbitals.Count * model.Header.Flavours.Count} basis states, mu = {model.Header.Mu:G10} {Units.EnergyUnits.Symbol(model.Header.Unit)})");
            return ExitCodes.Success;
        });
        return command;
    }
}
