using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis;
using Meanfield.Analysis.Curvature;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;
using Meanfield.Output;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield curvature INPUT --plane "O; S1; S2" --out FILE.csv`: Berry curvature of the occupied bands on a plane.</summary>
public static class CurvatureCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var plane = new Option<string>("--plane")
        {
            Description = "Plane k = ORIGIN + s SPAN1 + t SPAN2 (s, t in 0..1), reduced coordinates: \"0,0,0.25; 1,0,0; 0,1,0\"",
            Required = true,
        };
        var grid = new Option<int>("--grid") { Description = "Plaquettes along each span", DefaultValueFactory = _ => 48 };
        var searchMesh = NodesCommand.SearchMesh(12);
        var command = new Command("curvature", "Berry curvature of the occupied bands on a plane of the zone: table (CSV or Parquet by extension) and heatmap (PNG next to it)")
            { output, plane, grid, searchMesh };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var err = parse.InvocationConfiguration.Error;
            var outPath = parse.GetValue(output)!;
            if (Path.GetExtension(outPath).ToLowerInvariant() is not (".csv" or ".parquet")) throw new UserInputException($"--out {outPath}: use a .csv or .parquet file name");
            CommonOptions.RefuseOverwrite(parse.GetValue(solution.Input)!, [outPath, Path.ChangeExtension(outPath, ".png")]);
            var (origin, span1, span2) = ParsePlane(parse.GetValue(plane)!);
            int n = parse.GetValue(grid);
            if (n < 2 || n > 1000) throw new UserInputException($"--grid {n}: use 2..1000 plaquettes per span");
            int sm = NodesCommand.CheckSearchMesh(parse.GetValue(searchMesh));
            var src = solution.Resolve(parse, o);
            var model = src.Model;
            if (model.IsMomentumFree) throw new UserInputException($"{model.SourcePath}: a momentum-free lattice has no Berry curvature");
            if (model.Lattice.Dimension == 2 && (origin.Z != 0 || span1.Z != 0 || span2.Z != 0))
                throw new UserInputException($"--plane: {model.Name} is two-dimensional; third reduced components must be 0");
            int occ = NodesCommand.OccupiedBands(src);

            var map = BerryCurvature.Compute(src.Hamiltonian, origin, span1, span2, n, n, occ);
            var nodes = SpectrumSummary.Compute(src, new SpectrumRequest { SearchMesh = sm, Dos = false, Heat = false }).Nodes!;
            if (nodes.FermiSurfaceAwayFromNodes)
                err.WriteLine($"warning: bands {occ - 1} and {occ} overlap (a metal): the curvature of the {occ} lowest bands is not that of the occupied states.");
            double bMin = Math.Min(model.Lattice.B1.Norm, model.Lattice.B2.Norm);
            var inPlane = PlaneNodes.Find(model.Lattice, origin, span1, span2, nodes.Nodes, 1e-4 * bMin);

            var inv = CultureInfo.InvariantCulture;
            var meta = new Dictionary<string, string>(ResultProvenance.Of(src))
            {
                ["nodes_in_plane"] = string.Join(" ", inPlane.Select(p => string.Create(inv, $"(s={p.S:F4} t={p.T:F4} chirality={(p.Chirality is { } c ? c.ToString("+0;-0;0", inv) : "undetermined")})"))),
            };
            var picture = Path.ChangeExtension(outPath, ".png");
            CurvatureTableWriter.Write(map, outPath, meta);
            CurvaturePlot.Save(map, inPlane, picture, $"{model.Name}: Berry curvature, {occ} lowest bands");
            o.WriteLine(string.Create(inv, $"plane normal {map.Normal}; total flux / 2pi = {map.TotalFluxOver2Pi:F4}{(map.IsFullTorus ? $" (Chern number {map.ChernNumber})" : "")}"));
            o.WriteLine($"{inPlane.Count} node(s) in the plane" + (inPlane.Count > 0 ? ": " + meta["nodes_in_plane"] : ""));
            o.WriteLine($"wrote {outPath} and {picture} ({n}x{n} plaquettes)");
            return ExitCodes.Success;
        });
        return command;
    }

    /// <summary>"ORIGIN; SPAN1; SPAN2", each three comma-separated reduced coordinates; spans must not be parallel.</summary>
    internal static (Vec3 Origin, Vec3 Span1, Vec3 Span2) ParsePlane(string text)
    {
        var parts = text.Split(';');
        if (parts.Length != 3) throw new UserInputException($"--plane \"{text}\": expected \"ORIGIN; SPAN1; SPAN2\" (three vectors separated by ';')");
        var v = parts.Select((p, i) =>
        {
            var c = p.Split(',', StringSplitOptions.TrimEntries);
            var name = i == 0 ? "ORIGIN" : $"SPAN{i}";
            if (c.Length != 3) throw new UserInputException($"--plane: {name} '{p.Trim()}' needs three comma-separated numbers");
            var x = new double[3];
            for (int j = 0; j < 3; j++)
                if (!double.TryParse(c[j], NumberStyles.Float, CultureInfo.InvariantCulture, out x[j]) || !double.IsFinite(x[j]))
                    throw new UserInputException($"--plane: {name} component '{c[j]}' is not a number");
            return new Vec3(x[0], x[1], x[2]);
        }).ToArray();
        // The reduced-to-Cartesian map is invertible, so parallel reduced spans are parallel in k-space too.
        var cross = v[1].Cross(v[2]);
        if (!(cross.Norm > 1e-10 * Math.Max(v[1].Norm * v[2].Norm, 1e-300)))
            throw new UserInputException($"--plane \"{text}\": SPAN1 and SPAN2 are parallel or zero, so the plane does not cut the zone");
        return (v[0], v[1], v[2]);
    }
}
