using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis.Curvature;
using Meanfield.Lattices;
using Meanfield.Output;

namespace Meanfield.Cli.Commands;

/// <summary>
/// `meanfield curvature INPUT --corner K0 --sides A B --out FILE.csv`: Berry curvature of the occupied bands on the
/// parallelogram K0 + s A + t B of the zone.
/// </summary>
public static class CurvatureCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var corner = new Option<string>("--corner") { Description = "Corner of the parallelogram, reduced coordinates (such as 0,0,0.25)", DefaultValueFactory = _ => "0,0,0" };
        var sides = new Option<string[]>("--sides") { Description = "Its two sides A and B from the corner, reduced coordinates (such as 1,0,0 0,1,0)", Required = true, Arity = new ArgumentArity(2, 2), AllowMultipleArgumentsPerToken = true };
        var grid = new Option<int>("--grid") { Description = $"Plaquettes along each side (2..{CurvatureRequest.MaxGrid})", DefaultValueFactory = _ => 48 };
        var searchMesh = NodesCommand.SearchMesh(12);
        var command = new Command("curvature", "Berry curvature of the occupied bands on a parallelogram of the zone: table (CSV or Parquet by extension) and map (PNG next to it)")
            { output, corner, sides, grid, searchMesh };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var outPath = parse.GetValue(output)!;
            var o = CommonOptions.Messages(parse, outPath);
            CommonOptions.CheckTableOut(outPath);
            var s = parse.GetValue(sides)!;
            var request = new CurvatureRequest
            {
                Corner = Vector(parse.GetValue(corner), "--corner"), SideA = Vector(s[0], "--sides (A)"), SideB = Vector(s[1], "--sides (B)"),
                Grid = parse.GetValue(grid), SearchMesh = NodesCommand.CheckSearchMesh(parse.GetValue(searchMesh)),
            };
            request.Validate();
            CommonOptions.RefuseOverwrite(parse.GetValue(solution.Input)!, [outPath, Path.ChangeExtension(outPath, ".png")]);
            var src = solution.Resolve(parse, o);
            NodesCommand.OccupiedBands(src);
            var study = CurvatureStudy.Run(src, request);
            if (study.Metal)
                parse.InvocationConfiguration.Error.WriteLine($"warning: bands {study.Occupied - 1} and {study.Occupied} overlap (a metal): the curvature of the {study.Occupied} lowest bands is not that of the occupied states.");
            var meta = new Dictionary<string, string>(ResultProvenance.Of(src)) { ["nodes_in_plane"] = study.NodesText };
            var picture = CommonOptions.PictureBeside(outPath);
            CurvatureTableWriter.Write(study.Map, outPath, meta);
            if (picture is not null) CurvaturePlot.Save(study.Map, study.NodesInPlane, picture, $"{src.Model.Name}: Berry curvature, {study.Occupied} lowest bands");
            var map = study.Map;
            o.WriteLine(string.Create(CultureInfo.InvariantCulture, $"plane normal {map.Normal}; total flux / 2pi = {map.TotalFluxOver2Pi:F4}{(map.IsFullTorus ? $" (Chern number {map.ChernNumber})" : "")}"));
            o.WriteLine($"{study.NodesInPlane.Count} node(s) in the plane" + (study.NodesInPlane.Count > 0 ? ": " + study.NodesText : ""));
            o.WriteLine($"{CommonOptions.Wrote(outPath, picture)} ({request.Grid}x{request.Grid} plaquettes)");
            return ExitCodes.Success;
        });
        return command;
    }

    private static Vec3 Vector(string? text, string option) =>
        ReducedVectorText.Parse(text) is { Success: true } r ? r.Vector : throw new UserInputException($"{option} {text}: {ReducedVectorText.Parse(text).Error}");
}
