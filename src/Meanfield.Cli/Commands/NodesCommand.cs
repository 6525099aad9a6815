using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis;
using Meanfield.Analysis.Nodes;
using Meanfield.Output;
using Meanfield.Solutions;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield nodes INPUT --out nodes.json`: band touchings at the electron count, their offset from mu, the phase.</summary>
public static class NodesCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var searchMesh = SearchMesh(NodeSearchOptions.DefaultMesh);
        var command = new Command("nodes", "Band touchings (Weyl and Dirac nodes) between the highest filled and lowest empty band, with their offset from mu, as JSON")
            { output, searchMesh };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var err = parse.InvocationConfiguration.Error;
            var outPath = parse.GetValue(output)!;
            var o = CommonOptions.Messages(parse, outPath);
            if (!outPath.EndsWith(".json", StringComparison.OrdinalIgnoreCase) && !AtomicFile.IsStandardOutput(outPath))
                throw new UserInputException($"--out {outPath}: use a .json file name, or - for standard output");
            int sm = CheckSearchMesh(parse.GetValue(searchMesh));
            CommonOptions.RefuseOverwrite(parse.GetValue(solution.Input)!, [outPath]);
            var src = solution.Resolve(parse, o);
            OccupiedBands(src);
            var digest = SpectrumSummary.Compute(src, new SpectrumRequest { SearchMesh = sm });
            AtomicFile.WriteText(outPath, NodeReportJson.Build(src, digest, new Dictionary<string, string>(ResultProvenance.Of(src))) + "\n");
            o.Write(NodeReportText.Format(src, digest));
            foreach (var w in digest.Nodes!.Warnings) err.WriteLine($"warning: {w}");
            o.WriteLine(AtomicFile.IsStandardOutput(outPath) ? "wrote the report to standard output" : $"wrote {outPath}");
            return ExitCodes.Success;
        });
        return command;
    }

    internal static Option<int> SearchMesh(int fallback) =>
        new("--search-mesh") { Description = $"Coarse k-mesh of the node search (Gamma-centred, default {fallback}; a solution whose own mesh is at least as fine seeds the search from its own mesh instead)", DefaultValueFactory = _ => fallback };

    internal static int CheckSearchMesh(int n) =>
        n is >= 4 and <= 96 ? n : throw new UserInputException($"--search-mesh {n}: use 4..96 divisions");

    /// <summary>n_occ from the electron count: a whole number of filled bands, or a clear refusal (exit 4 for a partly filled band).</summary>
    internal static int OccupiedBands(Solution src)
    {
        var model = src.Model;
        if (model.IsMomentumFree) throw new UserInputException($"{model.SourcePath}: a momentum-free lattice has no k-space nodes");
        double ne = model.ElectronsPerCell;
        if (!src.WholeFilling && Math.Abs(ne - Math.Round(ne)) > Solution.WholeFillingTolerance)
            throw new NoAnswerException($"{model.Name}: {ne.ToString("G6", CultureInfo.InvariantCulture)} electrons per cell fill a band partly, so there is a Fermi surface and no band pair to search for nodes");
        if (!src.WholeFilling)
            throw new UserInputException($"{model.SourcePath}: electrons_per_cell = {ne.ToString("G6", CultureInfo.InvariantCulture)} leaves no empty or no filled band ({src.Hamiltonian.Size} bands)");
        return src.OccupiedBands;
    }
}
