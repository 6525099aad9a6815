using Meanfield.Units;
using System.CommandLine;
using System.Globalization;
using Meanfield.Heat;
using Meanfield.Output;

namespace Meanfield.Cli.Commands;

/// <summary>
/// `meanfield heat INPUT --tmin T1 --tmax T2 --out FILE.csv`: the quasiparticle specific heat from the renormalized DOS
/// (<see cref="HeatStudy"/>), its low-temperature fits, the tilt-aware node term, measured data and the full mean field.
/// </summary>
public static class HeatCommand
{
    public static Command Build()
    {
        var (input, set, temperature, mesh, output) = (CommonOptions.InputArgument(), CommonOptions.Set(), CommonOptions.Temperature(), CommonOptions.Mesh(), CommonOptions.Out());
        var tmin = new Option<string>("--tmin") { Description = "Lowest temperature: 0.05K, 0.004meV, or a bare number in the model's energy unit", Required = true };
        var tmax = new Option<string>("--tmax") { Description = "Highest temperature: 5K, 0.4meV, or a bare number in the model's energy unit", Required = true };
        var points = new Option<int>("--temperature-points") { Description = "Temperatures in the table (the fits add a logarithmic grid of their own)", DefaultValueFactory = _ => 60 };
        var log = new Option<bool>("--log") { Description = "Space the table's temperatures logarithmically (default: linearly)" };
        var window = new Option<string[]>("--fit-window")
        {
            Description = "Fit window of C/T = gamma + beta T^2 + delta T^4: two temperatures T1 T2 (such as 0.1K 2K; bare numbers in the model's energy unit), or \"auto\" (the widest window from the lowest T where the fit holds to 0.5 %)",
            Arity = new ArgumentArity(1, 2), AllowMultipleArgumentsPerToken = true,
        };
        var measured = new Option<string?>("--measured") { Description = "Measured heat capacity (.csv: T_K and C_J_per_mol_K or C_over_T_mJ_per_mol_K2)" };
        var debye = new Option<string?>("--debye") { Description = "Subtract a Debye phonon term with this Debye temperature (250K; a bare number is in the model's energy unit) from the measured data" };
        var atoms = new Option<double?>("--atoms") { Description = "Atoms per formula unit for --debye" };
        var reference = new Option<string?>("--reference") { Description = "Subtract the measured C of a non-magnetic reference compound (.csv, same format)" };
        var full = new Option<bool>("--full-mean-field") { Description = "Also C = -T d^2F/dT^2 with the saddle point re-solved at each T (slower)" };
        var mfPoints = new Option<int>("--mf-points") { Description = "Temperatures of the full mean-field sweep (uniform grid)", DefaultValueFactory = _ => 41 };
        var dosMesh = new Option<int?>("--dos-mesh") { Description = "Base k-mesh of the DOS, refined around the Fermi level in 3D (default: the solver mesh rounded up to even, at least 24)" };
        var command = new Command("heat", "Specific heat C(T) of the heavy quasiparticles: low-temperature fits, tilt-aware node term, comparison with measured data")
            { input, set, temperature, mesh, output, tmin, tmax, points, log, window, measured, debye, atoms, reference, full, mfPoints, dosMesh };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            string outPath = parse.GetValue(output)!;
            if (Path.GetExtension(outPath).ToLowerInvariant() is not (".csv" or ".parquet")) throw new UserInputException($"--out {outPath}: use a .csv or .parquet file name");
            foreach (var f in new[] { parse.GetValue(measured), parse.GetValue(reference) })
                if (f is not null && !File.Exists(f)) throw new UserInputException($"{f}: file not found");
            CommonOptions.RefuseOverwrite(parse.GetValue(input)!, HeatTableWriter.StudyFiles(outPath), parse.GetValue(measured), parse.GetValue(reference));
            var src = SolutionOptions.Open(parse.GetValue(input)!, parse.GetValue(set), parse.GetValue(temperature), parse.GetValue(mesh), false, o);
            // Temperatures read by the one grammar: a bare number is in the model's energy unit.
            var unit = src.Model.Unit;
            double K(string text, string option) => CommonOptions.ParseTemperature(text, unit, option) * unit.Kelvins();
            var request = new HeatStudyRequest
            {
                MinTemperatureK = K(parse.GetValue(tmin)!, "--tmin"), MaxTemperatureK = K(parse.GetValue(tmax)!, "--tmax"),
                Points = parse.GetValue(points), Logarithmic = parse.GetValue(log), FitWindowK = CommonOptions.ParseTemperatureWindow(parse.GetValue(window), unit, "--fit-window") is { } fw ? (fw.Low * unit.Kelvins(), fw.High * unit.Kelvins()) : null,
                MeasuredPath = parse.GetValue(measured), DebyeTemperatureK = parse.GetValue(debye) is { } d ? K(d, "--debye") : null, AtomsPerFormulaUnit = parse.GetValue(atoms),
                ReferencePath = parse.GetValue(reference), FullMeanField = parse.GetValue(full), MeanFieldPoints = parse.GetValue(mfPoints),
                DosMesh = parse.GetValue(dosMesh),
            };
            request = request with { Settings = CommonOptions.Settings(src.Model, parse.GetValue(temperature), parse.GetValue(mesh)) };
            request.Validate();
            HeatStudyResult result;
            try { result = HeatStudy.Run(src.Model, src.Hamiltonian, src.Mu, request); }
            catch (InvalidOperationException e)
            {
                parse.InvocationConfiguration.Error.WriteLine($"error: {e.Message}; nothing written");
                return ExitCodes.NotConverged;
            }
            foreach (var line in HeatReport.Lines(result)) o.WriteLine(line);
            var written = HeatTableWriter.WriteStudy(outPath, result, ResultProvenance.Of(src));
            o.WriteLine($"wrote {string.Join(", ", written)}");
            return ExitCodes.Success;
        });
        return command;
    }
}
