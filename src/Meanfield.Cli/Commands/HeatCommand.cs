using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Heat;
using Meanfield.Lattices;
using Meanfield.Output;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>
/// `meanfield heat INPUT --tmin T1 --tmax T2 --out FILE.csv`: the quasiparticle specific heat from the renormalized DOS,
/// its low-temperature fits, the analytic node term, optional measured data and the optional full mean-field C.
/// </summary>
public static class HeatCommand
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    public static Command Build()
    {
        var input = CommonOptions.InputArgument();
        var set = CommonOptions.Set();
        var temperature = CommonOptions.Temperature();
        var mesh = CommonOptions.Mesh();
        var output = CommonOptions.Out();
        var tmin = new Option<double>("--tmin") { Description = "Lowest temperature (K)", Required = true };
        var tmax = new Option<double>("--tmax") { Description = "Highest temperature (K)", Required = true };
        var points = new Option<int>("--points") { Description = "Temperatures in the table", DefaultValueFactory = _ => 60 };
        var log = new Option<bool>("--log") { Description = "Space the temperatures logarithmically (default: linearly)" };
        var window = new Option<string[]>("--fit-window")
        {
            Description = "Fit window: two temperatures T1 T2 (K), or \"auto\" (the widest window from the lowest T where C/T = gamma + beta T^2 holds to 1 %)",
            Arity = new ArgumentArity(1, 2), AllowMultipleArgumentsPerToken = true,
        };
        var measured = new Option<string?>("--measured") { Description = "Measured heat capacity (.csv: T_K and C_J_per_mol_K or C_over_T_mJ_per_mol_K2)" };
        var debye = new Option<double?>("--debye") { Description = "Subtract a Debye phonon term with this Debye temperature (K) from the measured data" };
        var atoms = new Option<double?>("--atoms") { Description = "Atoms per formula unit for --debye" };
        var reference = new Option<string?>("--reference") { Description = "Subtract the measured C of a non-magnetic reference compound (.csv, same format)" };
        var full = new Option<bool>("--full-mean-field") { Description = "Also C = -T d^2F/dT^2 with the saddle point re-solved at each T (slower)" };
        var mfPoints = new Option<int>("--mf-points") { Description = "Temperatures of the full mean-field sweep (uniform grid)", DefaultValueFactory = _ => 41 };
        var dosMesh = new Option<int?>("--dos-mesh") { Description = "Gamma-centred k-mesh of the tetrahedron DOS (default: the solver mesh rounded up to even, at least 24)" };
        var command = new Command("heat", "Specific heat C(T) of the heavy quasiparticles: Sommerfeld and power-law fits, node term, comparison with measured data")
            { input, set, temperature, mesh, output, tmin, tmax, points, log, window, measured, debye, atoms, reference, full, mfPoints, dosMesh };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var req = new Request(parse.GetValue(output)!, parse.GetValue(tmin), parse.GetValue(tmax), parse.GetValue(points),
                parse.GetValue(log), parse.GetValue(window), parse.GetValue(measured), parse.GetValue(debye), parse.GetValue(atoms),
                parse.GetValue(reference), parse.GetValue(full), parse.GetValue(mfPoints), parse.GetValue(dosMesh));
            req.Validate();
            CommonOptions.RefuseOverwrite(parse.GetValue(input)!, [req.Out, Path.ChangeExtension(req.Out, ".residuals.csv"), Path.ChangeExtension(req.Out, ".png"), Path.ChangeExtension(req.Out, ".loglog.png")], req.Measured, req.Reference);
            var measuredData = LoadMeasured(req);
            var src = SolutionOptions.Open(parse.GetValue(input)!, parse.GetValue(set), parse.GetValue(temperature), parse.GetValue(mesh), false, o);
            return Run(req, src, measuredData, parse.GetValue(temperature), parse.GetValue(mesh), o, parse.InvocationConfiguration.Error);
        });
        return command;
    }

    private sealed record Request(string Out, double TMin, double TMax, int Points, bool Log, string[]? Window, string? Measured,
                                  double? Debye, double? Atoms, string? Reference, bool Full, int MfPoints, int? DosMesh)
    {
        public (double Lo, double Hi)? ExplicitWindow { get; private set; }

        public void Validate()
        {
            if (!Out.EndsWith(".csv", StringComparison.OrdinalIgnoreCase)) throw new UserInputException($"--out {Out}: use a .csv file name");
            if (!(TMin > 0) || !double.IsFinite(TMax) || !(TMax > TMin)) throw new UserInputException($"--tmin {TMin} --tmax {TMax}: need 0 < tmin < tmax (K)");
            if (Points < 3) throw new UserInputException($"--points {Points}: need at least 3");
            if (Full && MfPoints < 5) throw new UserInputException($"--mf-points {MfPoints}: need at least 5");
            if (DosMesh is { } m && m < 4) throw new UserInputException($"--dos-mesh {m}: need at least 4");
            if ((Debye is null) != (Atoms is null)) throw new UserInputException("--debye THETA and --atoms N go together");
            if (Debye is not null && Reference is not null) throw new UserInputException("give either --debye/--atoms or --reference, not both");
            if ((Debye is not null || Reference is not null) && Measured is null) throw new UserInputException("--debye and --reference act on --measured data; give --measured");
            if (Window is { Length: > 0 } w && !(w.Length == 1 && w[0] == "auto"))
            {
                if (w.Length != 2 || !double.TryParse(w[0], NumberStyles.Float, Inv, out var lo) || !double.TryParse(w[1], NumberStyles.Float, Inv, out var hi) || !(hi > lo) || !(lo >= 0))
                    throw new UserInputException($"--fit-window {string.Join(" ", w)}: give two temperatures T1 < T2 in K, or auto");
                ExplicitWindow = (lo, hi);
            }
        }
    }

    private static MeasuredHeat? LoadMeasured(Request req)
    {
        if (req.Measured is null) return null;
        try
        {
            var data = MeasuredHeatCsv.Load(Exists(req.Measured));
            if (req.Debye is { } theta)
            {
                if (!(theta > 0) || !(req.Atoms > 0)) throw new UserInputException($"--debye {theta} --atoms {req.Atoms}: both must be positive");
                data = PhononSubtraction.Debye(data, theta, req.Atoms!.Value);
            }
            if (req.Reference is { } r) data = PhononSubtraction.Reference(data, MeasuredHeatCsv.Load(Exists(r)));
            return data;
        }
        catch (HeatDataError e) { throw new UserInputException(e.Message); }
    }

    private static string Exists(string path) =>
        File.Exists(path) ? path : throw new UserInputException($"{path}: file not found");

    private static int Run(Request req, Solutions.Solution src, MeasuredHeat? measured, string? temperature, int? mesh, TextWriter o, TextWriter error)
    {
        var model = src.Model;
        if (model.IsMomentumFree || model.Lattice.Dimension < 2)
            throw new UserInputException($"{model.SourcePath}: heat needs the quasiparticle DOS of a lattice with momentum (2D or 3D)");
        var unit = model.Unit;
        double kelvins = unit.Kelvins();
        var settings = CommonOptions.Settings(model, temperature, mesh);
        int dosMesh = req.DosMesh ?? Math.Max(24, settings.Mesh + settings.Mesh % 2);
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var engine = new TetrahedronDos(src.Hamiltonian, new KMesh(model.Lattice, dosMesh));
        var dos = DosTabulation.ForHeat(engine, model, req.TMin, req.TMax);
        var heat = new QuasiparticleHeat(dos);
        double mu0 = dos.GroundStateFermiLevel();
        var temps = Temperatures(req);
        var thermal = temps.Select(heat.At).ToArray();
        var curve = new HeatCurve(temps, thermal.Select(p => p.MolarHeatCapacity).ToArray());
        o.WriteLine($"quasiparticle DOS: {dos.Energies.Length} energies, tetrahedra on a {dosMesh}^{model.Lattice.Dimension} mesh; rho(E_F) = {dos.At(mu0):G5} states/{unit.Symbol()}/cell ({clock.Elapsed.TotalSeconds:F1} s)");

        var nodes = FindNodes(src, model, mu0, req.TMin / kelvins, o);
        var fit = FitWindow(req, curve, o);
        PowerLawFit? power = TryPower(curve, fit.WindowMinK, fit.WindowMaxK, o);
        Report(o, "predicted", fit, power, LowTemperatureLaw.DepartureTemperature(curve, fit, 5));
        if (nodes is not null)
        {
            o.WriteLine($"nodes at the Fermi level: {nodes.Nodes.Count} ({nodes.Cones} cones), analytic beta = {1e3 * nodes.MolarBeta:G5} mJ mol^-1 K^-4, mean hbar v = {nodes.MeanHbarV:G5} {unit.Symbol()} A");
            if (fit.Beta > 0)
            {
                var v = new NodeHeat(unit, model.Lattice.CellVolume, model.FormulaUnitsPerCell).VelocityFromBeta(fit.Beta, fit.BetaError, nodes.Cones);
                o.WriteLine($"v* from the fitted beta ({nodes.Cones} cones): hbar v* = {v.HbarV:G5} +- {v.HbarVError:G2} {unit.Symbol()} A = {v.MetresPerSecond:G4} +- {v.MetresPerSecondError:G2} m/s");
            }
            var agree = AgreementWindow.Find(curve, nodes.MolarHeat, 0.10);
            o.WriteLine(agree is { } a
                ? $"numerical and analytic node heat agree within 10 % from {a.MinK:G4} to {a.MaxK:G4} K"
                : "numerical and analytic node heat agree within 10 % nowhere in the range (refine --dos-mesh, or the cones are not linear over the range)");
        }
        else o.WriteLine("no linear nodes at the Fermi level: node column left empty");

        HeatComparison? comparison = null;
        if (measured is not null)
            comparison = Compare(curve, measured, fit, o);

        MeanFieldHeatSweep? sweep = null;
        HeatCurve? fullCurve = null;
        if (req.Full)
        {
            if (model.Shells.Count == 0) throw new UserInputException($"{model.SourcePath}: no correlated shell, so there is no mean field to re-solve");
            var grid = MeanFieldHeat.Grid(req.TMin, req.TMax, req.MfPoints);
            try
            {
                sweep = MeanFieldHeat.Sweep((t, g) => new SaddlePointSolver(model, settings with { Temperature = t, InitialGuess = g }).Solve(),
                                            unit, model.FormulaUnitsPerCell, grid,
                                            decoupled: t => new SaddlePointSolver(model, settings with { Temperature = t }).Decoupled());
            }
            catch (InvalidOperationException e)
            {
                error.WriteLine($"error: full mean field: {e.Message}; nothing written");
                return ExitCodes.NotConverged;
            }
            fullCurve = sweep.Curve();
            o.WriteLine($"full mean field: {grid.Length} saddle points from {grid[0]:G4} to {grid[^1]:G4} K on a {settings.Mesh}^3 {(settings.Shifted ? "shifted " : "")}mesh");
            if (sweep.LastKondoK is { } lo && sweep.FirstDecoupledK is { } hi)
                o.WriteLine($"C_full jumps at T_K^MF between {lo:G5} and {hi:G5} K, where r drops to 0: an artifact of the mean-field approximation (in reality the Kondo scale is a crossover, not a transition)");
            else o.WriteLine("C_full: no change of branch in the range (T_K^MF lies outside it)");
        }

        var columns = new List<string> { "T_K", "C_J_per_mol_K", "C_over_T_mJ_per_mol_K2", "S_J_per_mol_K", "node_C_J_per_mol_K", "mu_minus_mu0" };
        if (fullCurve is not null) columns.Add("C_full_J_per_mol_K");
        var rows = thermal.Select(p =>
        {
            var row = new List<double?> { p.TemperatureK, p.MolarHeatCapacity, p.MolarCOverTMilli, p.MolarEntropy,
                nodes?.MolarHeat(p.TemperatureK), p.ChemicalPotential - mu0 };
            if (fullCurve is not null)
                row.Add(p.TemperatureK >= fullCurve.MinTemperatureK && p.TemperatureK <= fullCurve.MaxTemperatureK ? fullCurve.At(p.TemperatureK) : null);
            return (IReadOnlyList<double?>)row;
        }).ToList();
        HeatTableWriter.Write(req.Out, Header(src, model, dosMesh, dos, fit, measured, req, sweep), columns, rows);
        var written = new List<string> { req.Out };
        if (comparison is not null)
        {
            var residualPath = Path.ChangeExtension(req.Out, ".residuals.csv");
            HeatTableWriter.Write(residualPath,
                [$"measured ({measured!.SourcePath}{(measured.Subtracted.Length > 0 ? ", minus " + measured.Subtracted : "")}) minus predicted, per mole of formula units", "units: T in K, C in J mol^-1 K^-1; relative = difference / predicted"],
                ["T_K", "C_measured_J_per_mol_K", "C_predicted_J_per_mol_K", "difference_J_per_mol_K", "relative"],
                comparison.Residuals.Select(r => (IReadOnlyList<double?>)[r.TemperatureK, r.Measured, r.Predicted, r.Difference, r.Relative]));
            written.Add(residualPath);
        }
        var png = Path.ChangeExtension(req.Out, ".png");
        var loglog = Path.ChangeExtension(req.Out, ".loglog.png");
        HeatPlots.SaveSommerfeld(png, $"{model.Name}: C/T against T²", curve, measured?.Curve, fit, comparison?.MeasuredSommerfeld, fullCurve);
        if (power is not null)
        {
            HeatPlots.SaveLogLog(loglog, $"{model.Name}: log C against log T", curve, measured?.Curve, power, comparison?.MeasuredPowerLaw);
            written.Add(png); written.Add(loglog);
        }
        else written.Add(png);
        o.WriteLine($"wrote {string.Join(", ", written)} ({clock.Elapsed.TotalSeconds:F1} s)");
        return ExitCodes.Success;
    }

    private static double[] Temperatures(Request req) => Enumerable.Range(0, req.Points).Select(i =>
    {
        double s = i / (req.Points - 1.0);
        double t = req.Log ? req.TMin * Math.Pow(req.TMax / req.TMin, s) : req.TMin + s * (req.TMax - req.TMin);
        return i == req.Points - 1 ? req.TMax : t;
    }).ToArray();

    private static FermiLevelNodes? FindNodes(Solutions.Solution src, Binding.BoundModel model, double mu0, double pinning, TextWriter o)
    {
        double n = model.ElectronsPerCell;
        int occupied = (int)Math.Round(n);
        if (model.Lattice.Dimension != 3 || Math.Abs(n - occupied) > 1e-9 || occupied < 1 || occupied >= src.Hamiltonian.Size) return null;
        var search = NodeSearch.Find(src.Hamiltonian, occupied, mu0);
        var nodes = FermiLevelNodes.From(search, model, Math.Max(pinning, 1e-9));
        if (nodes is null && search.Nodes.Count > 0)
            o.WriteLine($"node search: {search.Nodes.Count} touchings of bands {occupied - 1} and {occupied}, none a type-I cone at E_F (closest {search.Nodes.Min(n => Math.Abs(n.EnergyOffset)):G3} {model.Unit.Symbol()} away){(search.FermiSurfaceAwayFromNodes ? "; the spectrum is metallic" : "")}");
        return nodes;
    }

    private static SommerfeldFit FitWindow(Request req, HeatCurve curve, TextWriter o)
    {
        if (req.ExplicitWindow is { } w) return SommerfeldFit.Fit(curve, w.Lo, w.Hi);
        try { return LowTemperatureLaw.SelectWindow(curve, WindowCriterion.MaxRelativeDeviation, 0.01); }
        catch (ArgumentException)
        {
            int n = Math.Max(3, curve.Count / 10);
            o.WriteLine($"note: C/T = gamma + beta T^2 holds to 1 % over no window from {curve.MinTemperatureK:G4} K; fitting the lowest {n} points");
            return SommerfeldFit.Fit(curve, 0, curve.TemperaturesK[n - 1]);
        }
    }

    private static PowerLawFit? TryPower(HeatCurve curve, double lo, double hi, TextWriter o)
    {
        try { return PowerLawFit.Fit(curve, lo, hi); }
        catch (ArgumentException e) when (e.Message.Contains("C > 0")) { o.WriteLine($"note: no power-law fit: {e.Message}"); return null; }
    }

    private static void Report(TextWriter o, string what, SommerfeldFit fit, PowerLawFit? power, double? departure)
    {
        o.WriteLine($"{what}: window {fit.WindowMinK:G4}-{fit.WindowMaxK:G4} K ({fit.Points} points)");
        o.WriteLine($"  gamma = {fit.GammaMilli:G6} +- {1e3 * fit.GammaError:G2} mJ mol^-1 K^-2, beta = {1e3 * fit.Beta:G5} +- {1e3 * fit.BetaError:G2} mJ mol^-1 K^-4");
        if (power is not null) o.WriteLine($"  power law C ~ T^alpha: alpha = {power.Exponent:F4} +- {power.ExponentError:F4}");
        if (departure is { } d) o.WriteLine($"  C/T leaves gamma + beta T^2 by more than 5 % from {d:G4} K");
        else if (what == "predicted") o.WriteLine("  C/T stays within 5 % of gamma + beta T^2 over the whole range");
    }

    private static HeatComparison Compare(HeatCurve predicted, MeasuredHeat measured, SommerfeldFit fit, TextWriter o)
    {
        var c = HeatComparison.Compare(predicted, measured.Curve, fit.WindowMinK, fit.WindowMaxK);
        var dep = LowTemperatureLaw.DepartureTemperature(measured.Curve, c.MeasuredSommerfeld, 10, consecutive: 3);
        o.WriteLine($"measured: {measured.SourcePath} ({measured.Curve.Count} points{(measured.Subtracted.Length > 0 ? ", minus " + measured.Subtracted : "")})");
        Report(o, "measured", c.MeasuredSommerfeld, c.MeasuredPowerLaw, null);
        o.WriteLine(dep is { } d ? $"  C/T leaves the fitted law by more than 10 % (3 points running) from {d:G4} K" : "  C/T stays within 10 % of the fitted law over the data");
        o.WriteLine($"{"",-34}{"predicted",16}{"measured",16}");
        o.WriteLine($"{"gamma (mJ mol^-1 K^-2)",-34}{c.PredictedSommerfeld.GammaMilli,16:G5}{c.MeasuredSommerfeld.GammaMilli,16:G5}");
        o.WriteLine($"{"beta (mJ mol^-1 K^-4)",-34}{1e3 * c.PredictedSommerfeld.Beta,16:G4}{1e3 * c.MeasuredSommerfeld.Beta,16:G4}");
        o.WriteLine($"{"alpha (C ~ T^alpha)",-34}{c.PredictedPowerLaw.Exponent,16:F3}{c.MeasuredPowerLaw.Exponent,16:F3}");
        o.WriteLine($"gamma measured / predicted = {c.GammaRatio:G4}; rms relative residual {c.RmsRelativeResidual:P1} over {c.Residuals.Count} points");
        return c;
    }

    private static IEnumerable<string> Header(Solutions.Solution src, Binding.BoundModel model, int dosMesh, TabulatedDos dos, SommerfeldFit fit,
                                              MeasuredHeat? measured, Request req, MeanFieldHeatSweep? sweep)
    {
        var u = model.Unit.Symbol();
        yield return $"meanfield heat {Provenance.ToolVersion}, {Provenance.NowUtc()}";
        yield return $"model: {model.Name} ({model.SourcePath}), sha256 {Provenance.Hash(model.SourceText)}";
        yield return $"saddle point: {src.OriginText}, T = {src.Temperature * model.Unit.Kelvins():G5} K, mu = {src.Mu:G8} {u}";
        yield return $"quasiparticle DOS: linear tetrahedra on a Gamma-centred {dosMesh}-division mesh, {dos.Energies.Length} energies, fine near E_F; {dos.ElectronsPerCell:G8} electrons per cell (tabulated count)";
        yield return $"per mole of formula units ({model.FormulaUnitsPerCell:G6} per cell); C at fixed electron count with mu(T)";
        yield return $"units: T_K in K; C and S in J mol^-1 K^-1; C/T in mJ mol^-1 K^-2; node_C = analytic Weyl/Dirac-cone T^3 sum (empty without nodes at E_F); mu_minus_mu0 = mu(T) - mu(T->0) in {u}";
        yield return $"Sommerfeld fit over {fit.WindowMinK:G4}-{fit.WindowMaxK:G4} K: gamma = {fit.GammaMilli:G6} mJ mol^-1 K^-2, beta = {1e3 * fit.Beta:G5} mJ mol^-1 K^-4";
        if (measured is not null) yield return $"measured data: {measured.SourcePath}{(measured.Subtracted.Length > 0 ? ", minus " + measured.Subtracted : "")}";
        if (sweep is not null)
            yield return "C_full = -T d^2F/dT^2 with the saddle point re-solved at each T (3-point differences, interpolated linearly); its jump at T_K^MF is a mean-field artifact (a crossover in reality)";
    }
}
