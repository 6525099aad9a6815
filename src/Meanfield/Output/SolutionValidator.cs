using System.Globalization;
using Meanfield.Binding;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// Checks a solution file before anything uses it, in three layers: its own fields (present, finite, in range and
/// consistent with each other), its fit to the model (unit, parameters, shell groups, levels, electron count), and,
/// optionally, one evaluation of the saddle-point equations at its amplitudes. Every failure is an
/// <see cref="InvalidDataException"/> naming the file and the field, which the command line reports with exit code 2.
/// </summary>
public static class SolutionValidator
{
    /// <summary>
    /// Relative tolerance of the redundant fields (z = r^2, eps_f + lambda - mu, T in kelvin, n_f + r^2 = Q): the file
    /// stores round-trip doubles and the solver converges to 1e-9 or better, so an honest file agrees to far below it.
    /// </summary>
    public const double ConsistencyTolerance = 1e-6;

    /// <summary>
    /// Largest saddle-point residual accepted on re-evaluation, relative to the scale it judges (Q for the constraint,
    /// the model's largest energy for mu and the stationarity equation): 1e4 times the default solver tolerance.
    /// </summary>
    public const double ResidualTolerance = 1e-6;

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The document's own fields: present, finite, in range, and consistent with each other.</summary>
    /// <exception cref="InvalidDataException">A field is missing, not finite, out of range or inconsistent.</exception>
    public static void CheckFields(SolutionDocument doc, string path)
    {
        Require(doc.EnergyUnit, path, "energy_unit");
        if (!EnergyUnits.TryParse(doc.EnergyUnit, out var unit)) throw Bad(path, "energy_unit", $"'{doc.EnergyUnit}' is not meV, eV or K");
        Require(doc.Branch, path, "branch");
        if (doc.Branch is not ("kondo" or "decoupled")) throw Bad(path, "branch", $"'{doc.Branch}' is neither kondo nor decoupled");
        if (doc.Iterations < 0) throw Bad(path, "iterations", $"{doc.Iterations} is negative");
        NonNegative(doc.ResidualNorm, path, "residual_norm");
        NonNegative(doc.Temperature, path, "temperature");
        NonNegative(doc.TemperatureK, path, "temperature_k");
        if (!Close(doc.TemperatureK, doc.Temperature * unit.Kelvins(), Math.Max(doc.TemperatureK, 1e-300)))
            throw Bad(path, "temperature_k", $"{doc.TemperatureK.ToString("G6", Inv)} K does not match temperature {doc.Temperature.ToString("G6", Inv)} {unit.Symbol()}");
        Finite(doc.Mu, path, "mu");
        Finite(doc.FreeEnergy, path, "free_energy");
        if (doc.DecoupledFreeEnergy is { } fd) Finite(fd, path, "decoupled_free_energy");
        NonNegative(doc.ElectronsPerCell, path, "electrons_per_cell");
        if (doc.Spectrum is { } sp)
        {
            if (sp.DirectGap is { } dg) Finite(dg, path, "spectrum.direct_gap");
            if (sp.IndirectGap is { } ig) Finite(ig, path, "spectrum.indirect_gap");
            if (sp.DosFermiTotal is { } dt) NonNegative(dt, path, "spectrum.dos_fermi_total");
            if (sp.DosFermiCorrelated is { } dc) NonNegative(dc, path, "spectrum.dos_fermi_correlated");
            if (sp.MaxNodeOffset is { } mo) NonNegative(mo, path, "spectrum.max_node_offset");
        }
        Require(doc.ModelPath, path, "model_path");
        if (doc.ModelPath.Length == 0) throw Bad(path, "model_path", "is empty: the solution does not name its model file");
        Require(doc.ModelSha256, path, "model_sha256");
        if (doc.ModelSha256.Length != 64 || !doc.ModelSha256.All(Uri.IsHexDigit)) throw Bad(path, "model_sha256", "is not a SHA-256 (64 hexadecimal digits)");
        if (doc.Sampling is null) throw Bad(path, "sampling", "is missing");
        if (doc.Sampling.Mesh is < Models.PhysicalRange.MinMesh or > Models.PhysicalRange.MaxMesh)
            throw Bad(path, "sampling.mesh", $"{doc.Sampling.Mesh} is outside {Models.PhysicalRange.MinMesh}..{Models.PhysicalRange.MaxMesh}");

        if (doc.Parameters is null) throw Bad(path, "parameters", "is missing (null)");
        foreach (var (name, value) in doc.Parameters)
        {
            if (string.IsNullOrEmpty(name)) throw Bad(path, "parameters", "has an entry without a name");
            Finite(value, path, $"parameters.{name}");
        }

        if (doc.Sites is null) throw Bad(path, "sites", "is missing (null): a solution has one entry per shell group");
        if (doc.Sites.Count == 0) throw Bad(path, "sites", "is empty: a solution has one entry per shell group");
        for (int i = 0; i < doc.Sites.Count; i++)
        {
            var s = doc.Sites[i];
            string f = $"sites[{i}]";
            if (s is null) throw Bad(path, f, "is null");
            if (string.IsNullOrEmpty(s.Name)) throw Bad(path, $"{f}.name", "is missing");
            if (s.Shells < 1) throw Bad(path, $"{f}.shells", $"{s.Shells} is not a positive shell count");
            NonNegative(s.R, path, $"{f}.r", "a boson amplitude r is >= 0");
            Finite(s.Lambda, path, $"{f}.lambda");
            Finite(s.BareLevel, path, $"{f}.bare_level");
            Finite(s.RenormalizedLevel, path, $"{f}.renormalized_level");
            NonNegative(s.NF, path, $"{f}.n_f");
            NonNegative(s.Z, path, $"{f}.z");
            if (!Close(s.Z, s.R * s.R, Math.Max(s.Z, 1e-300)))
                throw Bad(path, $"{f}.z", $"{s.Z.ToString("G8", Inv)} is not r^2 = {(s.R * s.R).ToString("G8", Inv)}");
            double scale = Math.Max(1, Math.Max(Math.Abs(s.BareLevel), Math.Max(Math.Abs(s.Lambda), Math.Abs(doc.Mu))));
            if (!Close(s.RenormalizedLevel, s.BareLevel + s.Lambda - doc.Mu, scale))
                throw Bad(path, $"{f}.renormalized_level", $"{s.RenormalizedLevel.ToString("G8", Inv)} is not bare_level + lambda - mu = {(s.BareLevel + s.Lambda - doc.Mu).ToString("G8", Inv)} (lambda or mu was edited?)");
            CheckBosons(s, path, f);
        }
    }

    /// <summary>
    /// The four bosons of a finite-U group: all given with U, each in [0, 1], completeness e^2 + 2 p^2 + d^2 = 1,
    /// n_f = 2 (p^2 + d^2) and r = p (e + d) / sqrt((n_f/2)(1 - n_f/2)) (Kotliar &amp; Ruckenstein, PRL 57, 1362 (1986), Eqs. 3-5).
    /// </summary>
    private static void CheckBosons(SolutionDocument.SiteEntry s, string path, string f)
    {
        if (s.U is null)
        {
            if (s.E is not null || s.P is not null || s.D is not null) throw Bad(path, $"{f}.u", "is missing but the four bosons e, p, d are given");
            return;
        }
        NonNegative(s.U.Value, path, $"{f}.u", "the on-site repulsion is >= 0");
        foreach (var (name, v) in new[] { ("e", s.E), ("p", s.P), ("d", s.D) })
        {
            if (v is not { } x) throw Bad(path, $"{f}.{name}", "is missing: a finite-U group carries its bosons e, p, d");
            NonNegative(x, path, $"{f}.{name}", "a boson amplitude is >= 0");
            if (x > 1) throw Bad(path, $"{f}.{name}", $"{x.ToString("G6", Inv)} exceeds 1 (completeness e^2 + 2 p^2 + d^2 = 1)");
        }
        var b = new FourBosonAmplitudes(s.E!.Value, s.P!.Value, s.D!.Value);
        double completeness = b.E * b.E + 2 * b.P * b.P + b.D * b.D;
        if (!Close(completeness, 1, 1))
            throw Bad(path, $"{f}.p", $"e^2 + 2 p^2 + d^2 = {completeness.ToString("G8", Inv)} is not 1 (a boson was edited?)");
        if (!Close(b.Filling, s.NF, 2))
            throw Bad(path, $"{f}.n_f", $"{s.NF.ToString("G8", Inv)} is not 2 (p^2 + d^2) = {b.Filling.ToString("G8", Inv)} (n_f or a boson was edited?)");
        if (!Close(b.Z, s.R * s.R, 1))
            throw Bad(path, $"{f}.r", $"r^2 = {(s.R * s.R).ToString("G8", Inv)} is not the four-boson z = {b.Z.ToString("G8", Inv)} (r or a boson was edited?)");
    }

    /// <summary>
    /// The document against the model it names (bound with the document's parameters): unit, parameters, electron
    /// count, shell groups and their levels, and the constraint n_f + r^2 = Q. Parameter-dependent checks are skipped
    /// when <paramref name="model"/> was bound with other values (command-line overrides on top of the solution).
    /// </summary>
    /// <exception cref="InvalidDataException">The document does not fit the model.</exception>
    public static void CheckAgainst(SolutionDocument doc, BoundModel model, string path)
    {
        if (doc.EnergyUnit != model.Unit.Symbol())
            throw Bad(path, "energy_unit", $"'{doc.EnergyUnit}' is not the model's unit '{model.Unit.Symbol()}'");
        var groups = model.ShellGroups();
        if (groups.Count != doc.Sites.Count || groups.Where((g, i) => g != doc.Sites[i].Name).Any())
            throw Bad(path, "sites", $"shell groups [{string.Join(", ", doc.Sites.Select(s => s.Name))}] do not match the model's [{string.Join(", ", groups)}]");
        if (!SameParameters(doc, model)) return;
        if (!Close(doc.ElectronsPerCell, model.ElectronsPerCell, Math.Max(1, model.ElectronsPerCell)))
            throw Bad(path, "electrons_per_cell", $"{doc.ElectronsPerCell.ToString("G8", Inv)} is not the model's {model.ElectronsPerCell.ToString("G8", Inv)}");
        for (int g = 0; g < groups.Count; g++)
        {
            var s = doc.Sites[g];
            var shells = model.Shells.Where(x => x.Group == groups[g]).ToList();
            string f = $"sites[{g}]";
            if (s.Shells != shells.Count) throw Bad(path, $"{f}.shells", $"{s.Shells} is not the model's {shells.Count} shell(s) in group '{groups[g]}'");
            if (!Close(s.BareLevel, shells[0].Level, Math.Max(1, Math.Abs(shells[0].Level))))
                throw Bad(path, $"{f}.bare_level", $"{s.BareLevel.ToString("G8", Inv)} is not the model's level {shells[0].Level.ToString("G8", Inv)}");
            if (shells[0].HasFiniteU != s.HasFiniteU)
                throw Bad(path, $"{f}.u", shells[0].HasFiniteU
                    ? $"is missing, but the model's group '{groups[g]}' has finite U = {shells[0].U.ToString("G6", Inv)}: an infinite-U solution does not fit it"
                    : $"is {s.U!.Value.ToString("G6", Inv)}, but the model's group '{groups[g]}' is infinite-U: a finite-U solution does not fit it");
            if (s.HasFiniteU)
            {
                if (!Close(s.U!.Value, shells[0].U, Math.Max(1, shells[0].U)))
                    throw Bad(path, $"{f}.u", $"{s.U.Value.ToString("G8", Inv)} is not the model's U = {shells[0].U.ToString("G8", Inv)}");
                continue; // completeness replaces the constraint Q (checked with the fields)
            }
            double q = shells[0].Constraint;
            if (!Close(s.NF + s.R * s.R, q, q))
                throw Bad(path, $"{f}.r", $"n_f + r^2 = {(s.NF + s.R * s.R).ToString("G8", Inv)} is not the constraint Q = {q.ToString("G6", Inv)} (r or n_f was edited?)");
        }
    }

    /// <summary>
    /// Re-evaluates the saddle-point equations once (one pass over the solution's own k-mesh and temperature) at the
    /// stored amplitudes: the electron count must give the stored mu, and n_f + r^2 = Q and dF/dr = 0 must hold for every
    /// group within <see cref="ResidualTolerance"/>. Skipped for models bound with other parameter values.
    /// </summary>
    /// <exception cref="InvalidDataException">The stored numbers are not a saddle point of the model.</exception>
    public static void CheckSaddlePoint(SolutionDocument doc, BoundModel model, string path)
    {
        if (model.Shells.Count == 0 || !SameParameters(doc, model)) return;
        var settings = new SolverSettings
        {
            Temperature = doc.Temperature, Mesh = doc.Sampling.Mesh ?? 16, Shifted = doc.Sampling.Shifted ?? true,
        };
        var solver = new SaddlePointSolver(model, settings);
        if (solver.IsFiniteU) { CheckFiniteUSaddlePoint(doc, model, solver, path); return; }
        var amp = new MeanFieldAmplitudes([.. doc.Sites.Select(s => s.R)], [.. doc.Sites.Select(s => s.Lambda)]);
        var fill = BandFilling.Compute(solver.StateSum.Fill(amp), model.ElectronsPerCell, doc.Temperature, doc.Mu, solver.Tetrahedra);
        double e0 = EnergyScale(model);
        // At T = 0 between bands every mu in the window of no states holds the count (the solve places it at a node
        // energy there); elsewhere the count fixes mu.
        bool inWindow = fill.Window is { Width: > 0 } w && doc.Mu >= w.Lower - ResidualTolerance * e0 && doc.Mu <= w.Upper + ResidualTolerance * e0;
        if (!inWindow && Math.Abs(fill.Mu - doc.Mu) > ResidualTolerance * e0)
            throw Bad(path, "mu", $"{doc.Mu.ToString("G10", Inv)} does not hold {model.ElectronsPerCell.ToString("G6", Inv)} electrons per cell at these amplitudes (that needs mu = {fill.Mu.ToString("G10", Inv)}): not a saddle point of the model");
        var groups = model.ShellGroups();
        for (int g = 0; g < groups.Count; g++)
        {
            var shells = model.Shells.Where(x => x.Group == groups[g]).ToList();
            double m = shells.Count, q = shells[0].Constraint, r = amp.R[g];
            double constraint = fill.FOccupation[g] / m + r * r - q;
            if (Math.Abs(constraint) > ResidualTolerance * q)
                throw Bad(path, $"sites[{g}]", $"n_f + r^2 - Q = {constraint.ToString("G3", Inv)} at these amplitudes: not a saddle point of the model (r or lambda was edited?)");
            double stationarity = fill.GrandPotentialSlope[g] / m + 2 * amp.Lambda[g] * r;
            if (Math.Abs(stationarity) > ResidualTolerance * e0)
                throw Bad(path, $"sites[{g}]", $"dF/dr = {stationarity.ToString("G3", Inv)} {model.Unit.Symbol()} at these amplitudes: not a saddle point of the model (r or lambda was edited?)");
        }
    }

    /// <summary>The finite-U equations at the stored bosons and multipliers (one pass): mu, n_f = n_b, dF/de = dF/dd = 0.</summary>
    private static void CheckFiniteUSaddlePoint(SolutionDocument doc, BoundModel model, SaddlePointSolver solver, string path)
    {
        var bosons = doc.Sites.Select(s => new FourBosonAmplitudes(s.E!.Value, s.P!.Value, s.D!.Value)).ToList();
        double[] res; BandFilling fill;
        try { (res, fill) = solver.FiniteUResiduals(bosons, [.. doc.Sites.Select(s => s.Lambda)]); }
        catch (ArgumentException e) { throw Bad(path, "sites", e.Message); }
        double e0 = EnergyScale(model);
        bool inWindow = fill.Window is { Width: > 0 } w && doc.Mu >= w.Lower - ResidualTolerance * e0 && doc.Mu <= w.Upper + ResidualTolerance * e0;
        if (!inWindow && Math.Abs(fill.Mu - doc.Mu) > ResidualTolerance * e0)
            throw Bad(path, "mu", $"{doc.Mu.ToString("G10", Inv)} does not hold {model.ElectronsPerCell.ToString("G6", Inv)} electrons per cell at these bosons (that needs mu = {fill.Mu.ToString("G10", Inv)}): not a saddle point of the model");
        int groups = doc.Sites.Count;
        for (int g = 0; g < groups; g++)
        {
            if (Math.Abs(res[g]) > ResidualTolerance)
                throw Bad(path, $"sites[{g}]", $"n_f - 2 (p^2 + d^2) = {res[g].ToString("G3", Inv)} at these bosons: not a saddle point of the model (a boson or lambda was edited?)");
            double stationarity = Math.Max(Math.Abs(res[groups + g]), Math.Abs(res[2 * groups + g]));
            if (stationarity > ResidualTolerance)
                throw Bad(path, $"sites[{g}]", $"dF/de or dF/dd = {stationarity.ToString("G3", Inv)} (relative to the largest model energy) at these bosons: not a saddle point of the model (a boson or lambda was edited?)");
        }
    }

    // The model was bound with the document's own parameter values (no overrides on top).
    private static bool SameParameters(SolutionDocument doc, BoundModel model) =>
        model.Parameters.All(p => doc.Parameters.TryGetValue(p.Key, out var v) && Close(v, p.Value, Math.Max(1, Math.Abs(p.Value))));

    // The largest energy of the model (at least 1 unit): the scale of mu and of the stationarity residual.
    private static double EnergyScale(BoundModel model)
    {
        double e = 1;
        foreach (var s in model.Shells) e = Math.Max(e, Math.Abs(s.Level));
        foreach (var h in model.Hoppings) e = Math.Max(e, h.Amplitude.MaxAbs());
        foreach (var o in model.Onsite) e = Math.Max(e, o.Amplitude.MaxAbs());
        return e;
    }

    private static bool Close(double a, double b, double scale) => Math.Abs(a - b) <= ConsistencyTolerance * scale;

    private static void Require(object? value, string path, string field)
    {
        if (value is null) throw Bad(path, field, "is missing (null)");
    }

    private static void Finite(double v, string path, string field)
    {
        if (!double.IsFinite(v)) throw Bad(path, field, $"{v.ToString(Inv)} is not a finite number");
    }

    private static void NonNegative(double v, string path, string field, string? why = null)
    {
        Finite(v, path, field);
        if (v < 0) throw Bad(path, field, $"{v.ToString("G6", Inv)} is negative{(why is null ? "" : $" ({why})")}");
    }

    /// <summary>"file: field: problem; the file was edited or damaged: solve again".</summary>
    public static InvalidDataException Bad(string path, string field, string problem) =>
        new($"{path}: {field}: {problem}; the solution file was edited or damaged: solve again");
}
