using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis;
using Meanfield.Analysis.Dos;
using Meanfield.Lattices;
using Meanfield.Output;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield dos INPUT --out FILE`: total, kind- and site-resolved DOS as a table and a picture.</summary>
public static class DosCommand
{
    public static Command Build()
    {
        var input = CommonOptions.InputArgument();
        var set = CommonOptions.Set();
        var temperature = CommonOptions.Temperature();
        var output = CommonOptions.Out();
        var mesh = new Option<int>("--dos-mesh") { Description = "k-mesh divisions per reciprocal axis of the DOS tetrahedra (Gamma-centred)", DefaultValueFactory = _ => 24 };
        var solverMesh = CommonOptions.Mesh();
        var window = new Option<double[]>("--window") { Description = "Energy window E1 E2 around mu (model energy unit, relative to mu as in bands, hall and dipole; default: the band range)", Arity = new ArgumentArity(2, 2), AllowMultipleArgumentsPerToken = true };
        var step = new Option<double?>("--step") { Description = "Energy step (default: bandwidth / 2000)" };
        var gaussian = new Option<double?>("--gaussian") { Description = "Gaussian broadening SIGMA (energy unit) instead of linear tetrahedra (smears the E^2 law near nodes)" };
        var bare = CommonOptions.Bare();
        var command = new Command("dos", "Density of states (tetrahedron method): table (CSV or Parquet by extension) and a picture (PNG next to it)")
            { input, set, temperature, solverMesh, output, mesh, window, step, gaussian, bare };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var err = parse.InvocationConfiguration.Error;
            var outPath = parse.GetValue(output)!;
            var ext = Path.GetExtension(outPath).ToLowerInvariant();
            if (ext is not (".csv" or ".parquet")) throw new UserInputException($"--out {outPath}: use a .csv or .parquet file name");
            CommonOptions.RefuseOverwrite(parse.GetValue(input)!, [outPath, Path.ChangeExtension(outPath, ".png")]);
            int n = parse.GetValue(mesh);
            if (n < 2 || n > 200) throw new UserInputException($"--dos-mesh {n}: use 2..200 divisions");
            var win = parse.GetValue(window) is { Length: 2 } given ? given : null;
            if (win is { Length: 2 } && !(win[1] > win[0])) throw new UserInputException($"--window {win[0]} {win[1]}: E2 must exceed E1");
            var dE = parse.GetValue(step);
            if (dE is { } s0 && !(s0 > 0)) throw new UserInputException($"--step {s0}: must be positive");
            var sigma = parse.GetValue(gaussian);
            if (sigma is { } g0 && !(g0 > 0)) throw new UserInputException($"--gaussian {g0}: must be positive");

            var src = SolutionOptions.Open(parse.GetValue(input)!, parse.GetValue(set), parse.GetValue(temperature), parse.GetValue(solverMesh), parse.GetValue(bare), o);
            var model = src.Model;
            if (model.IsMomentumFree) throw new UserInputException($"{model.SourcePath}: a momentum-free lattice has an analytic DOS; `dos` needs a lattice with momentum");
            var kmesh = new KMesh(model.Lattice, n);
            var tetra = new TetrahedronDos(src.Hamiltonian, kmesh);
            var (lo, hi) = tetra.Spectrum.Range();
            double width = Math.Max(hi - lo, 1e-12);
            double e0 = win is null ? lo : src.Mu + win[0], e1 = win is null ? hi : src.Mu + win[1];
            double h = dE ?? width / 2000;
            long points = (long)Math.Floor((e1 - e0) / h + 1e-9) + 1;
            if (points < 2) throw new UserInputException($"--step {h:G6}: wider than the window {e0:G6}..{e1:G6}");
            if (points > 2_000_000) throw new UserInputException($"--step {h:G6}: {points} energies are too many (at most 2,000,000)");
            double spacing = width / (tetra.Spectrum.Bands * (double)kmesh.Count);
            if (sigma is null && h < spacing)
            {
                int suggest = (int)Math.Ceiling(Math.Pow(width / (tetra.Spectrum.Bands * h), 1.0 / model.Lattice.Dimension));
                err.WriteLine($"warning: the step {h:G4} is finer than the mean level spacing {spacing:G4} of mesh {kmesh}; fine structure below it is interpolation. Try --dos-mesh {suggest}.");
            }
            var options = new DosOptions
            {
                Points = (int)points, Minimum = e0, Maximum = e0 + (points - 1) * h,
                Method = sigma is null ? DosMethod.Tetrahedron : DosMethod.Gaussian, Sigma = sigma ?? 0,
            };
            var dos = tetra.Compute(options);
            double mu = src.Mu;
            var atMu = tetra.DosAtEnergy(mu);

            DosTableWriter.Write(dos, mu, model.Unit, outPath, [new("mesh", kmesh.ToString()), .. ResultProvenance.Of(src)]);
            var picture = Path.ChangeExtension(outPath, ".png");
            DosPlot.Save(dos, mu, model.Unit, picture, $"{model.Name}: {(src.Origin == Solutions.SolutionOrigin.BareModel ? "bare" : "renormalized")} DOS", win is null ? null : (win[0] - mu, win[1] - mu));

            var u = model.Unit.Symbol();
            double fu = model.FormulaUnitsPerCell;
            var inv = CultureInfo.InvariantCulture;
            o.WriteLine(string.Create(inv, $"mu = {mu:G8} {u} ({SolutionDocument.RuleName(src.MuRule)}, {src.OriginText})"));
            o.WriteLine(string.Create(inv, $"DOS at mu: total {atMu.Total:G6}, correlated {atMu.Correlated:G6} states/{u} per cell; total {atMu.Total / fu:G6}, correlated {atMu.Correlated / fu:G6} per formula unit"));
            o.WriteLine($"wrote {outPath} and {picture} ({points} energies, {dos.Method})");
            return ExitCodes.Success;
        });
        return command;
    }
}
