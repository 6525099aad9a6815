using System.Globalization;
using System.Text;
using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// Writes a heat table as comma-separated text: '#' comment lines (units, provenance), a header row, then one row per
/// temperature; a missing value (null or NaN) is an empty cell. Written atomically: an error leaves no file.
/// </summary>
public static class HeatTableWriter
{
    public static void Write(string path, IEnumerable<string> comments, IReadOnlyList<string> columns,
                             IEnumerable<IReadOnlyList<double?>> rows)
    {
        var sb = new StringBuilder();
        foreach (var c in comments) sb.Append("# ").AppendLine(c);
        sb.AppendLine(string.Join(",", columns));
        foreach (var row in rows)
        {
            if (row.Count != columns.Count) throw new ArgumentException($"a row has {row.Count} values for {columns.Count} columns");
            sb.AppendLine(string.Join(",", row.Select(v => v is { } x && double.IsFinite(x) ? x.ToString("G10", CultureInfo.InvariantCulture) : "")));
        }
        AtomicFile.WriteText(path, sb.ToString());
    }

    /// <summary>
    /// Writes a heat study: the table at <paramref name="path"/> (.csv), the measured-minus-predicted residuals beside it
    /// (.residuals.csv) when measured data were given, and the two pictures (.png, .loglog.png). Returns the files
    /// written. <paramref name="origin"/> names where the saddle point came from, for the header.
    /// </summary>
    public static IReadOnlyList<string> WriteStudy(string path, HeatStudyResult r, string origin)
    {
        var model = r.Model;
        var u = model.Unit.Symbol();
        var e = r.Expansion;
        var full = r.FullCurve;
        var comments = new List<string>
        {
            $"meanfield heat {Provenance.ToolVersion}, {Provenance.NowUtc()}",
            $"model: {model.Name} ({model.SourcePath}), sha256 {Provenance.Hash(model.SourceText)}",
            $"saddle point: {origin}{(r.SolutionMu is { } mu ? $", mu = {mu:G10} {u}" : "")}",
            $"quasiparticle DOS: {r.DosMethod}, {r.KPoints} k-points, {r.Dos.Energies.Length} energies; {r.Dos.ElectronsPerCell:G10} electrons per cell; T -> 0 Fermi level {r.FermiLevel:G10} {u}",
            $"per mole of formula units ({model.FormulaUnitsPerCell:G6} per cell); C at fixed electron count with mu(T)",
            $"units: T_K in K; C and S in J mol^-1 K^-1; C/T in mJ mol^-1 K^-2; node_C = analytic tilt-aware cone term beta_nodes T^3 (empty without nodes at E_F); mu_minus_mu0 = mu(T) - E_F(T->0) in {u}",
            $"fit C/T = gamma + beta T^2 + delta T^4 over {e.WindowMinK:G4}-{e.WindowMaxK:G4} K: gamma = {e.GammaMilli:G4} +- {1e3 * e.GammaError:G2} mJ mol^-1 K^-2, beta = {1e3 * e.Beta:G6} +- {1e3 * e.BetaError:G2} mJ mol^-1 K^-4, delta = {1e3 * e.Delta:G4} mJ mol^-1 K^-6",
        };
        if (r.Nodes is { Cones: > 0 } n)
            comments.Add($"node term: {n.Cones} cones, beta_nodes = {1e3 * n.MolarBeta:G6} mJ mol^-1 K^-4 (tilt factor {n.TiltFactor:G4}); C leaves the low-T law by {HeatStudy.DeparturePercent} % from {(r.DepartureK is { } d ? $"{d:G4} K" : "beyond the range")}");
        if (r.Measured is { } m) comments.Add($"measured data: {m.SourcePath}{(m.Subtracted.Length > 0 ? ", minus " + m.Subtracted : "")}");
        if (full is not null)
            comments.Add("C_full = -T d^2F/dT^2 with the saddle point re-solved at each T (3-point differences, interpolated linearly); its jump at T_K^MF is a mean-field artifact (a crossover in reality)");
        var columns = new List<string> { "T_K", "C_J_per_mol_K", "C_over_T_mJ_per_mol_K2", "S_J_per_mol_K", "node_C_J_per_mol_K", "mu_minus_mu0" };
        if (full is not null) columns.Add("C_full_J_per_mol_K");
        var rows = r.Table.Select(p =>
        {
            var row = new List<double?> { p.TemperatureK, p.MolarHeatCapacity, p.MolarCOverTMilli, p.MolarEntropy,
                r.Nodes is { Cones: > 0 } nodes ? nodes.MolarHeat(p.TemperatureK) : null, p.ChemicalPotential - r.FermiLevel };
            if (full is not null)
                row.Add(p.TemperatureK >= full.MinTemperatureK && p.TemperatureK <= full.MaxTemperatureK ? full.At(p.TemperatureK) : null);
            return (IReadOnlyList<double?>)row;
        }).ToList();
        var written = new List<string>();
        Write(path, comments, columns, rows);
        written.Add(path);
        if (r.Comparison is { } c)
        {
            var residualPath = Path.ChangeExtension(path, ".residuals.csv");
            var meas = r.Measured!;
            Write(residualPath,
                [$"measured ({meas.SourcePath}{(meas.Subtracted.Length > 0 ? ", minus " + meas.Subtracted : "")}) minus predicted, per mole of formula units", "units: T in K, C in J mol^-1 K^-1; relative = difference / predicted"],
                ["T_K", "C_measured_J_per_mol_K", "C_predicted_J_per_mol_K", "difference_J_per_mol_K", "relative"],
                c.Residuals.Select(x => (IReadOnlyList<double?>)[x.TemperatureK, x.Measured, x.Predicted, x.Difference, x.Relative]));
            written.Add(residualPath);
        }
        written.AddRange(HeatPlots.SaveStudy(path, r));
        return written;
    }
}
