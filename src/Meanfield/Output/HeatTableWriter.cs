using System.Globalization;
using System.Text;
using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// Writes heat tables through <see cref="ColumnTable"/> (CSV or Parquet by extension; units per column in the CSV's
/// '#' lines and in the Parquet file and column metadata); a missing value is an empty cell or a null. Written
/// atomically: an error leaves no file.
/// </summary>
public static class HeatTableWriter
{
    /// <summary>Writes one heat table; every row has one value (or null) per column.</summary>
    /// <exception cref="ArgumentException">A row of the wrong length, or an extension other than .csv and .parquet.</exception>
    public static void Write(string path, string title, IEnumerable<KeyValuePair<string, string>> metadata, IReadOnlyList<TableColumn> columns,
                             IEnumerable<IReadOnlyList<double?>> rows)
    {
        var list = rows.ToList();
        var values = new double?[columns.Count][];
        for (int c = 0; c < columns.Count; c++) values[c] = new double?[list.Count];
        for (int r = 0; r < list.Count; r++)
        {
            if (list[r].Count != columns.Count) throw new ArgumentException($"a row has {list[r].Count} values for {columns.Count} columns");
            for (int c = 0; c < columns.Count; c++) values[c][r] = list[r][c];
        }
        ColumnTable.Write(path, title, [.. metadata], [.. columns.Select((c, i) => new TableData(c, values[i]))]);
    }

    /// <summary>Every file <see cref="WriteStudy"/> may write for the table <paramref name="path"/>: table, residuals, the two pictures.</summary>
    public static IReadOnlyList<string> StudyFiles(string path) =>
        [path, Path.ChangeExtension(path, ".residuals" + Path.GetExtension(path)), Path.ChangeExtension(path, ".png"), Path.ChangeExtension(path, ".loglog.png")];

    /// <summary>
    /// Writes a heat study: the table at <paramref name="path"/> (.csv or .parquet), the measured-minus-predicted
    /// residuals beside it (.residuals.csv or .residuals.parquet) when measured data were given, and the two pictures
    /// (.png, .loglog.png). Returns the files written. <paramref name="provenance"/> describes where the saddle point
    /// came from (<see cref="ResultProvenance"/>).
    /// </summary>
    public static IReadOnlyList<string> WriteStudy(string path, HeatStudyResult r, IEnumerable<KeyValuePair<string, string>> provenance)
    {
        var model = r.Model;
        var u = model.Unit.Symbol();
        var e = r.Expansion;
        var full = r.FullCurve;
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        var meta = new List<KeyValuePair<string, string>>
        {
            new("quasiparticle_dos", string.Create(inv, $"{r.DosMethod}, {r.KPoints} k-points, {r.Dos.Energies.Length} energies; {r.Dos.ElectronsPerCell:G10} electrons per cell")),
            new($"fermi_level_{u}", r.FermiLevel.ToString("R", inv)),
            new("per_mole", string.Create(inv, $"per mole of formula units ({model.FormulaUnitsPerCell:G6} per cell); C at fixed electron count with mu(T)")),
            new("fit", string.Create(inv, $"C/T = gamma + beta T^2 + delta T^4 over {e.WindowMinK:G4}-{e.WindowMaxK:G4} K: gamma = {e.GammaMilli:G4} +- {1e3 * e.GammaError:G2} mJ mol^-1 K^-2, beta = {1e3 * e.Beta:G6} +- {1e3 * e.BetaError:G2} mJ mol^-1 K^-4, delta = {1e3 * e.Delta:G4} mJ mol^-1 K^-6")),
        };
        if (r.Nodes is { Cones: > 0 } n)
            meta.Add(new("node_term", string.Create(inv, $"{n.Cones} cones, beta_nodes = {1e3 * n.MolarBeta:G6} mJ mol^-1 K^-4 (tilt factor {n.TiltFactor:G4}); C leaves the low-T law by {HeatStudy.DeparturePercent} % from {(r.DepartureK is { } d ? $"{d:G4} K" : "beyond the range")}")));
        if (r.Measured is { } m) meta.Add(new("measured", $"{m.SourcePath}{(m.Subtracted.Length > 0 ? ", minus " + m.Subtracted : "")}"));
        if (full is not null)
            meta.Add(new("full_mean_field", "C_full = -T d^2F/dT^2 with the saddle point re-solved at each T (3-point differences, interpolated linearly); its jump at T_K^MF is a mean-field artifact (a crossover in reality)"));
        meta.AddRange(provenance);
        var columns = new List<TableColumn>
        {
            new("T_K", "K", "temperature"),
            new("C_J_per_mol_K", "J mol^-1 K^-1", "quasiparticle specific heat"),
            new("C_over_T_mJ_per_mol_K2", "mJ mol^-1 K^-2", "C / T"),
            new("S_J_per_mol_K", "J mol^-1 K^-1", "entropy"),
            new("node_C_J_per_mol_K", "J mol^-1 K^-1", "analytic tilt-aware cone term beta_nodes T^3 (empty without nodes at the Fermi level)"),
            new($"mu_minus_mu0_{u}", u, "mu(T) - E_F(T -> 0)"),
        };
        if (full is not null) columns.Add(new("C_full_J_per_mol_K", "J mol^-1 K^-1", "C of the full mean field, re-solved at each T"));
        var rows = r.Table.Select(p =>
        {
            var row = new List<double?> { p.TemperatureK, p.MolarHeatCapacity, p.MolarCOverTMilli, p.MolarEntropy,
                r.Nodes is { Cones: > 0 } nodes ? nodes.MolarHeat(p.TemperatureK) : null, p.ChemicalPotential - r.FermiLevel };
            if (full is not null)
                row.Add(p.TemperatureK >= full.MinTemperatureK && p.TemperatureK <= full.MaxTemperatureK ? full.At(p.TemperatureK) : null);
            return (IReadOnlyList<double?>)row;
        }).ToList();
        var written = new List<string>();
        Write(path, $"specific heat of {model.Name}", meta, columns, rows);
        written.Add(path);
        if (r.Comparison is { } c)
        {
            var residualPath = Path.ChangeExtension(path, ".residuals" + Path.GetExtension(path));
            var meas = r.Measured!;
            Write(residualPath, "measured minus predicted specific heat, per mole of formula units",
                [new("measured", $"{meas.SourcePath}{(meas.Subtracted.Length > 0 ? ", minus " + meas.Subtracted : "")}"), .. provenance],
                [new("T_K", "K", "temperature of the measured point"), new("C_measured_J_per_mol_K", "J mol^-1 K^-1", "measured C"),
                 new("C_predicted_J_per_mol_K", "J mol^-1 K^-1", "predicted C at that temperature"),
                 new("difference_J_per_mol_K", "J mol^-1 K^-1", "measured minus predicted"), new("relative", "1", "difference / predicted")],
                c.Residuals.Select(x => (IReadOnlyList<double?>)[x.TemperatureK, x.Measured, x.Predicted, x.Difference, x.Relative]));
            written.Add(residualPath);
        }
        written.AddRange(HeatPlots.SaveStudy(path, r));
        return written;
    }
}
