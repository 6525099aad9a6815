using System.CommandLine;
using System.Text.Json;
using Meanfield.Bloch;
using Meanfield.Output;
using Meanfield.Renormalization;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield export SOLUTION --format json|hopping-table --out FILE`: the renormalized one-body model.</summary>
public static class ExportCommand
{
    public static Command Build()
    {
        var input = new Argument<string>("SOLUTION") { Description = "A solution file from `solve`" };
        var format = new Option<string>("--format") { Description = "json or hopping-table", DefaultValueFactory = _ => "json" };
        format.AcceptOnlyFromAmong("json", "hopping-table");
        var output = CommonOptions.Out();
        var command = new Command("export", "Write the renormalized tight-binding model (r-scaled hybridization, shifted f levels, mu) for other codes") { input, format, output };
        command.SetAction(parse =>
        {
            var path = parse.GetValue(input)!;
            if (!path.EndsWith(".json", StringComparison.OrdinalIgnoreCase)) throw new UserInputException($"{path}: export needs a solution file (.json) from `solve`");
            CommonOptions.RefuseOverwrite(path, [parse.GetValue(output)!]);
            var src = Solutions.Solution.Load(path);
            var amp = src.Amplitudes!;
            var renormalized = RenormalizedModel.Build(src.Model, amp);
            var outPath = parse.GetValue(output)!;
            var comment = $"meanfield {Provenance.ToolVersion} renormalized model of {src.Model.Name}; energies in {Units.EnergyUnits.Symbol(src.Model.Unit)}; chemical potential {src.Mu:R}; model sha256 {Provenance.Hash(src.Model.SourceText)}";
            if (parse.GetValue(format) == "hopping-table")
                HoppingTable.FromModel(renormalized, comment).Save(outPath);
            else
                AtomicFile.WriteText(outPath, RenormalizedModelJson.Write(renormalized, src.Mu, comment));
            parse.InvocationConfiguration.Output.WriteLine($"wrote {outPath}");
            return ExitCodes.Success;
        });
        return command;
    }
}
