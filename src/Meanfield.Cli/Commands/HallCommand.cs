using System.CommandLine;
using Meanfield.Analysis.Responses;
using Meanfield.Output;
using Meanfield.Output.Topology;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield hall INPUT --window MU1 MU2 --out FILE`: intrinsic anomalous Hall conductivity against mu and T.</summary>
public static class HallCommand
{
    /// <summary>Builds the `hall` command.</summary>
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var response = new ResponseOptions("0");
        var command = new Command("hall", "Intrinsic anomalous Hall conductivity from the Berry curvature against mu and T: table (CSV or Parquet) and picture (PNG next to it)")
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
            var (mu, t, mesh) = response.Parse(parse, mu0, model.Unit, positiveTemperature: false);

            var r = AnomalousHall.Compute(src.Hamiltonian, mu, t, mesh);

            var meta = new Dictionary<string, string>(ResultProvenance.Of(src));
            ResponseTables.WriteHall(r, outPath, mu0, model.Unit, meta);
            var picture = CommonOptions.PictureBeside(outPath);
            if (picture is not null) ResponsePlots.SaveHall(r, picture, $"{model.Name}: anomalous Hall conductivity", mu0, model.Unit);
            string u = model.Unit.Symbol();
            o.WriteLine($"mu0 = {ResponseOptions.Format(mu0)} {u}; mesh {r.Samples.Mesh} ({r.Samples.Count} samples, {r.Samples.RefinedCells} refined cells)");
            o.WriteLine($"sign: sigma = -(e^2/hbar) Int f Omega; a filled band of Chern number C gives sigma_xy = -C e^2/h");
            int mid = (mu.Length - 1) / 2;
            for (int it = 0; it < t.Length; it++)
            {
                var s = r.Conductivity[it, mid];
                o.WriteLine($"T = {ResponseOptions.Format(t[it] * model.Unit.Kelvins())} K, mu - mu0 = {ResponseOptions.Format(mu[mid] - mu0)} {u}: "
                            + (r.Dimension == 3 ? $"sigma (yz, zx, xy) = ({ResponseOptions.Format(s.X)}, {ResponseOptions.Format(s.Y)}, {ResponseOptions.Format(s.Z)}) {r.Unit}"
                                                : $"sigma_xy = {ResponseOptions.Format(s.Z)} e^2/h per layer ({ResponseOptions.Format(r.StackedSiemensPerCentimetre(s.Z))} S/cm for layers {ResponseOptions.Format(r.LayerSpacing)} angstrom apart)"));
            }
            o.WriteLine(CommonOptions.Wrote(outPath, picture));
            return ExitCodes.Success;
        });
        return command;
    }
}
