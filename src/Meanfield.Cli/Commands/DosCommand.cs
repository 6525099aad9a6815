using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis.Dos;
using Meanfield.Output;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield dos INPUT --out FILE`: total, kind- and site-resolved DOS as a table and a picture (<see cref="DosStudy"/>).</summary>
public static class DosCommand
{
    public static Command Build()
    {
        var (input, set, temperature, output, solverMesh, bare) = (CommonOptions.InputArgument(), CommonOptions.Set(), CommonOptions.Temperature(), CommonOptions.Out(), CommonOptions.Mesh(), CommonOptions.Bare());
        var mesh = new Option<int>("--dos-mesh") { Description = $"k-mesh divisions per reciprocal axis of the DOS tetrahedra (Gamma-centred, 2..{DosRequest.MaxMesh})", DefaultValueFactory = _ => 24 };
        var window = CommonOptions.Window("Energy window E1 E2 relative to mu (-20 20, or -20meV 20meV; bare numbers in the model's energy unit); default: the whole band range");
        var step = new Option<string?>("--step") { Description = $"Energy step (0.01, 0.01meV; default: band range / {DosRequest.DefaultStepsAcrossBands})" };
        var gaussian = new Option<string?>("--gaussian") { Description = "Gaussian broadening SIGMA (0.5, 0.5meV) instead of linear tetrahedra (smears the E^2 law near nodes)" };
        var command = new Command("dos", "Density of states (tetrahedron method): table (CSV or Parquet by extension) and a picture (PNG next to it)")
            { input, set, temperature, solverMesh, output, mesh, window, step, gaussian, bare };
        command.SetAction(parse =>
        {
            var outPath = parse.GetValue(output)!;
            var o = CommonOptions.Messages(parse, outPath);
            CommonOptions.CheckTableOut(outPath);
            CommonOptions.RefuseOverwrite(parse.GetValue(input)!, [outPath, Path.ChangeExtension(outPath, ".png")]);
            // Units are read once the model (and its energy unit) is known; the mesh is checked before the solve.
            new DosRequest { Mesh = parse.GetValue(mesh) }.Validate();
            var src = SolutionOptions.Open(parse.GetValue(input)!, parse.GetValue(set), parse.GetValue(temperature), parse.GetValue(solverMesh), parse.GetValue(bare), o);
            var unit = src.Model.Unit;
            double? Energy(string? text, string option) => text is null ? null : CommonOptions.ParseEnergy(text, unit, option);
            var request = new DosRequest
            {
                Mesh = parse.GetValue(mesh), WindowAroundMu = CommonOptions.ParseWindow(parse.GetValue(window), unit),
                Step = Energy(parse.GetValue(step), "--step"), GaussianSigma = Energy(parse.GetValue(gaussian), "--gaussian"),
            };
            var study = DosStudy.Run(src, request);
            if (study.SuggestedMesh is { } suggest)
                parse.InvocationConfiguration.Error.WriteLine($"warning: the step is finer than the mean level spacing {study.LevelSpacing:G4} of mesh {study.Mesh}; fine structure below it is interpolation. Try --dos-mesh {suggest}.");
            double mu = src.Mu;
            DosTableWriter.Write(study.Dos, mu, unit, outPath, [new("mesh", study.Mesh.ToString()), .. ResultProvenance.Of(src)]);
            var picture = CommonOptions.PictureBeside(outPath);
            if (picture is not null) DosPlot.Save(study.Dos, mu, unit, picture, $"{src.Model.Name}: {(src.Origin == Solutions.SolutionOrigin.BareModel ? "bare" : "renormalized")} DOS", request.WindowAroundMu);
            var (u, fu, at) = (unit.Symbol(), src.Model.FormulaUnitsPerCell, study.AtMu);
            var inv = CultureInfo.InvariantCulture;
            o.WriteLine(string.Create(inv, $"mu = {mu:G8} {u} ({SolutionDocument.RuleName(src.MuRule)}, {src.OriginText})"));
            o.WriteLine(double.IsFinite(at.Correlated)
                ? string.Create(inv, $"DOS at mu: total {at.Total:G6}, correlated {at.Correlated:G6} states/{u} per cell; total {at.Total / fu:G6}, correlated {at.Correlated / fu:G6} per formula unit")
                : string.Create(inv, $"DOS at mu: {at.Total:G6} states/{u} per cell, {at.Total / fu:G6} per formula unit, conduction only (r = 0: the f shells are free moments, a flat level at mu, not a band)"));
            o.WriteLine($"{CommonOptions.Wrote(outPath, picture)} ({study.Dos.Energies.Length} energies, {study.Dos.Method})");
            return ExitCodes.Success;
        });
        return command;
    }
}
