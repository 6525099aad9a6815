using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis.Surfaces;
using Meanfield.Output;
using Meanfield.Output.Surfaces;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield facet INPUT --plane h,k,l --out F`: slab bands, surface spectral function or Fermi-arc map of a crystal face.</summary>
public static class FacetCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var plane = new Option<string>("--plane") { Description = "Miller indices h,k,l of the face (conventional cube for cubic lattices, reduced for explicit ones)", Required = true };
        var top = new Option<string?>("--top") { Description = "Site on the outermost atomic plane of the top face (default: the first site)" };
        var view = new Option<SurfaceView>("--view") { Description = "slab: slab bands; spectrum: surface spectral function along a path; arcs: its map at mu", DefaultValueFactory = _ => SurfaceView.Slab };
        var layers = new Option<int>("--layers") { Description = "Principal layers of the slab (at least 2)", DefaultValueFactory = _ => 16 };
        var eta = new Option<string?>("--eta") { Description = "Broadening (0.01, 0.01meV; bare numbers in the model's energy unit; default 4e-4 x the width of the heavy bands next to mu)" };
        var window = CommonOptions.Window("Energies E1 E2 relative to mu (-1 1, or -1meV 1meV; default +-0.1 x that width)");
        var path = new Option<string>("--path") { Description = "\"auto\" or surface-zone labels like \"G X M G\"", DefaultValueFactory = _ => "auto" };
        var points = new Option<int>("--points") { Description = "k-points along the path", DefaultValueFactory = _ => 240 };
        var energies = new Option<int>("--energies") { Description = "Energies of the path spectrum", DefaultValueFactory = _ => 200 };
        var grid = new Option<int>("--grid") { Description = "Points per side of the arc map", DefaultValueFactory = _ => 200 };
        var skin = new Option<string[]>("--skin") { Description = "Extra potential SHIFT DEPTH: SHIFT (an energy: 5, 5meV) on the outermost DEPTH elementary layers", Arity = new ArgumentArity(2, 2), AllowMultipleArgumentsPerToken = true };
        var both = new Option<bool>("--skin-both-faces") { Description = "Slab view: put the extra potential on the bottom face too" };
        var command = new Command("facet", "Spectra of a crystal face from the bulk saddle point: slab bands, semi-infinite surface spectral function, Fermi-arc map (table + PNG)")
            { output, plane, top, view, layers, eta, window, path, points, energies, grid, skin, both };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var outPath = parse.GetValue(output)!;
            if (Path.GetExtension(outPath).ToLowerInvariant() is not (".csv" or ".parquet")) throw new UserInputException($"--out {outPath}: use a .csv or .parquet file name");
            var src = solution.Resolve(parse, o);
            var unit = src.Model.Unit;
            var sk = parse.GetValue(skin) is { Length: 2 } given ? given : null;
            if (sk is not null && !(int.TryParse(sk[1], System.Globalization.NumberStyles.None, CultureInfo.InvariantCulture, out _)))
                throw new UserInputException($"--skin {sk[0]} {sk[1]}: DEPTH must be a whole number of layers");
            var request = new SurfaceRequest
            {
                Plane = parse.GetValue(plane)!, Termination = parse.GetValue(top), View = parse.GetValue(view), Layers = parse.GetValue(layers),
                Eta = parse.GetValue(eta) is { } e ? CommonOptions.ParseEnergy(e, unit, "--eta") : null, Window = CommonOptions.ParseWindow(parse.GetValue(window), unit),
                Path = parse.GetValue(path), Points = parse.GetValue(points), Energies = parse.GetValue(energies), Grid = parse.GetValue(grid), SkinOnBothFaces = parse.GetValue(both),
                Skin = sk is null ? null : new SkinPotential(CommonOptions.ParseEnergy(sk[0], unit, "--skin"), int.Parse(sk[1], CultureInfo.InvariantCulture)),
            };
            var watch = System.Diagnostics.Stopwatch.StartNew();
            var report = SurfaceStudy.Run(src, request);
            SurfaceTableWriter.Write(report, outPath, ResultProvenance.Of(src));
            var picture = Path.ChangeExtension(outPath, ".png");
            var c = report.Cut;
            SurfacePlots.Save(report, picture, $"{src.Model.Name} ({string.Join("", c.Plane.Indices.H, c.Plane.Indices.K, c.Plane.Indices.L)}), {string.Join("+", c.TopSites)} on top");
            var inv = CultureInfo.InvariantCulture;
            o.WriteLine($"face {c.Plane}, {c.Zone.Type.ToString().ToLowerInvariant()} surface zone, top plane {string.Join(" ", c.TopSites)}, {c.ElementaryLayers} elementary layer(s) per principal layer");
            o.WriteLine($"built from the {report.Hamiltonian}");
            o.WriteLine(string.Create(inv, $"mu = {report.ChemicalPotential:G8} {src.Model.Unit.Symbol()} ({report.ChemicalPotentialOrigin}); heavy-band scale {report.Scale:G4}, eta {report.Eta:G4} {src.Model.Unit.Symbol()}; {watch.Elapsed.TotalSeconds:F1} s"));
            foreach (var n in report.Nodes) o.WriteLine(string.Create(inv, $"projected node at ({n.S1:F4}, {n.S2:F4}) 1/angstrom: net chirality {n.Chirality:+0;-0;0} from {n.Count} node(s)"));
            foreach (var line in SurfaceStudy.TopologyLines(report)) o.WriteLine(line);
            foreach (var note in report.Notes) parse.InvocationConfiguration.Error.WriteLine($"note: {note}");
            o.WriteLine($"wrote {outPath} and {picture}");
            return ExitCodes.Success;
        });
        return command;
    }
}
