using System.CommandLine;
using Meanfield.Analysis.Bands;
using Meanfield.Lattices;
using Meanfield.Output;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield bands INPUT --out FILE`: band energies along a path, as a table and a picture.</summary>
public static class BandsCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var path = new Option<string>("--path") { Description = "\"auto\" (the lattice's standard path) or labels like \"G X W L G\" (| breaks the path)", DefaultValueFactory = _ => "auto" };
        var points = new Option<int>("--points") { Description = "k-points along the whole path", DefaultValueFactory = _ => 300 };
        var window = CommonOptions.Window("Picture's energy window E1 E2 relative to mu (-20 20, or -20meV 20meV; bare numbers in the model's energy unit), or \"all\"; default: mu +- 4 times the distance holding 80% of the correlated weight", allowAll: true);
        var weight = new Option<bool>("--no-weight") { Description = "Do not colour the bands by their correlated-orbital weight" };
        var command = new Command("bands", "Band energies along a high-symmetry path (CSV or Parquet by extension) and a picture (PNG next to it)")
            { output, path, points, window, weight };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var outPath = parse.GetValue(output)!;
            var o = CommonOptions.Messages(parse, outPath);
            CommonOptions.CheckTableOut(outPath);
            int count = parse.GetValue(points);
            if (count < 2) throw new UserInputException($"--points {count}: need at least 2");
            CommonOptions.RefuseOverwrite(parse.GetValue(solution.Input)!, [outPath, Path.ChangeExtension(outPath, ".png")]);
            var src = solution.Resolve(parse, o);
            if (src.Model.IsMomentumFree) throw new UserInputException($"{src.Model.SourcePath}: a momentum-free lattice has no bands along a path; use `dos`");
            var spec = parse.GetValue(path)!;
            var bandPath = spec == "auto" ? BandPath.Default(src.Model.Lattice) : BandPath.Parse(spec, src.Model.Lattice);
            var bands = BandStructure.Compute(src.Hamiltonian, bandPath.Sample(count));
            BandTableWriter.Write(bands, outPath, ResultProvenance.Of(src), src.Mu);
            var picture = CommonOptions.PictureBeside(outPath);
            var title = $"{src.Model.Name}: {(src.Origin == Solutions.SolutionOrigin.BareModel ? "bare bands" : "renormalized bands")}";
            var win = CommonOptions.ParseWindow(parse.GetValue(window), src.Model.Unit, allowAll: true);
            if (parse.GetValue(window) is ["all"]) { var (lo, hi) = bands.EnergyRange(); win = (lo - src.Mu, hi - src.Mu); }
            if (picture is not null) BandPlot.Save(bands, picture, title, src.Model.Unit, src.Mu, colourByCorrelatedWeight: !parse.GetValue(weight) && src.Model.Shells.Count > 0, window: win);
            o.WriteLine($"{CommonOptions.Wrote(outPath, picture)} ({bands.Energies().GetLength(0)} k-points, {bands.Energies().GetLength(1)} bands)");
            return ExitCodes.Success;
        });
        return command;
    }
}
