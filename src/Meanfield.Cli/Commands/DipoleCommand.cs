using System.CommandLine;
using Meanfield.Analysis.Responses;
using Meanfield.Output;
using Meanfield.Output.Topology;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield dipole INPUT --window MU1 MU2 --temperatures 5K --out FILE`: Berry curvature dipole against mu and T.</summary>
public static class DipoleCommand
{
    /// <summary>Builds the `dipole` command.</summary>
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var response = new ResponseOptions("10K");
        var command = new Command("dipole", "Berry curvature dipole (nonlinear Hall response) against mu and T, with its symmetry-allowed components: table and picture")
            { output };
        response.AddTo(command);
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var outPath = parse.GetValue(output)!;
            var o = CommonOptions.Messages(parse, outPath);
            CommonOptions.CheckTableOut(outPath);
            var src = solution.Resolve(parse, o);
            var model = src.Model;
            if (model.IsMomentumFree) throw new UserInputException($"{model.SourcePath}: a momentum-free lattice has no Berry curvature");
            double mu0 = src.Mu;
            var (mu, t, mesh) = response.Parse(parse, mu0, model.Unit, positiveTemperature: true);

            var r = CurvatureDipole.Compute(src.Hamiltonian, mu, t, mesh);
            var cone = ConeDipole.ForSolution(src);

            var meta = new Dictionary<string, string>(ResultProvenance.Of(src));
            if (cone is { Complete: true }) meta["cone_limit_D"] = string.Join(" ", cone.Tensor.Select(x => x.ToString("R", System.Globalization.CultureInfo.InvariantCulture)));
            ResponseTables.WriteDipole(r, outPath, mu0, model.Unit, meta);
            var picture = CommonOptions.PictureBeside(outPath);
            if (picture is not null) ResponsePlots.SaveDipole(r, picture, $"{model.Name}: Berry curvature dipole", mu0, model.Unit);
            o.WriteLine($"mu0 = {ResponseOptions.Format(mu0)} {model.Unit.Symbol()}; mesh {r.Samples.Mesh} ({r.Samples.Count} samples, {r.Samples.RefinedCells} refined cells)");
            o.WriteLine($"unit of D: {(r.Unit == "1" ? "dimensionless (3D)" : "angstrom (2D)")}; point group of {r.PointGroupOrder} operations{(r.HasInversion ? " with inversion: D vanishes" : "")}");
            o.WriteLine($"allowed independent tensors: {r.Allowed!.Count}" + (r.Allowed.Count > 0 ? "; forbidden components: " + string.Join(" ", r.Forbidden!) : ""));
            foreach (var b in r.Allowed)
                o.WriteLine("  [" + string.Join("; ", Enumerable.Range(0, 3).Select(a => string.Join(" ", b.Skip(3 * a).Take(3).Select(ResponseOptions.Format)))) + "]");
            double worst = 0;
            foreach (var d in r.Tensor) worst = Math.Max(worst, d.Max(Math.Abs));
            o.WriteLine($"largest |D_ab| on the grid: {ResponseOptions.Format(worst)}{(r.Unit == "1" ? "" : " " + r.Unit)}");
            if (cone is not null)
                o.WriteLine($"linear-cone limit of {cone.Cones} Weyl cones (any mu, T inside the linear range): [" + string.Join("; ", Enumerable.Range(0, 3).Select(a => string.Join(" ", cone.Tensor.Skip(3 * a).Take(3).Select(ResponseOptions.Format)))) + "]"
                            + (cone.Complete ? "" : $"; incomplete, left out: {string.Join("; ", cone.Skipped)}"));
            o.WriteLine(CommonOptions.Wrote(outPath, picture));
            return ExitCodes.Success;
        });
        return command;
    }
}
