using System.Globalization;
using System.Text;
using Meanfield.Analysis.Responses;
using Meanfield.Units;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output.Topology;

/// <summary>
/// Writes the anomalous Hall and curvature-dipole curves as long tables, one row per (temperature, mu), in CSV or
/// Parquet by extension, atomically, through <see cref="ColumnTable"/>. Column names end in their unit
/// ("sigma_xy_S_per_cm", "mu_meV", "temperature_K"; a dimensionless dipole is plain "D_xy"); the CSV's '#' lines and the
/// Parquet file and column metadata repeat the units, with the provenance.
/// </summary>
public static class ResponseTables
{
    /// <summary>The Hall table: mu, mu - mu0, T, then sigma_yz, sigma_zx, sigma_xy (and, in 2D, sigma_xy for a stack in S/cm).</summary>
    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void WriteHall(HallResult r, string path, double mu0, EnergyUnit unit, IReadOnlyDictionary<string, string> metadata)
    {
        string u = unit.Symbol(), su = r.Dimension == 3 ? "S_per_cm" : "e2_per_h";
        var cols = Base(r.ChemicalPotentials, r.Temperatures, mu0, unit);
        string[] names = ["sigma_yz", "sigma_zx", "sigma_xy"];
        for (int c = 0; c < 3; c++)
        {
            if (r.Dimension == 2 && c < 2) continue;
            int cc = c;
            cols.Add(($"{names[c]}_{su}", r.Unit, $"anomalous Hall conductivity {names[c]}", Grid(r.ChemicalPotentials.Count, r.Temperatures.Count, (it, im) => r.Conductivity[it, im][cc])));
        }
        if (r.Dimension == 2)
            cols.Add(("sigma_xy_stacked_S_per_cm", "S/cm", "sigma_xy of a stack of layers at the layer spacing", Grid(r.ChemicalPotentials.Count, r.Temperatures.Count,
                (it, im) => r.StackedSiemensPerCentimetre(r.Conductivity[it, im].Z))));
        var meta = new Dictionary<string, string>(metadata)
        {
            ["quantity"] = "intrinsic anomalous Hall conductivity sigma_ab = -(e^2/hbar) Int d^dk/(2pi)^d sum_n f_n Omega_n^ab (rigid bands)",
            ["energy_unit"] = u, ["conductivity_unit"] = r.Unit, ["mu0"] = mu0.ToString("R", CultureInfo.InvariantCulture),
            ["sampling"] = $"{r.Samples.Mesh}; {r.Samples.Count} samples, {r.Samples.RefinedCells} refined cells",
        };
        if (r.Dimension == 2) meta["layer_spacing_angstrom"] = r.LayerSpacing.ToString("R", CultureInfo.InvariantCulture);
        Write(path, cols, meta);
    }

    /// <summary>The dipole table: mu, mu - mu0, T, then the nine D_ab (a = derivative, b = curvature component).</summary>
    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void WriteDipole(DipoleResult r, string path, double mu0, EnergyUnit unit, IReadOnlyDictionary<string, string> metadata)
    {
        const string axes = "xyz";
        string du = r.Dimension == 3 ? "1" : "angstrom";
        var cols = Base(r.ChemicalPotentials, r.Temperatures, mu0, unit);
        for (int i = 0; i < 9; i++)
        {
            int ii = i;
            cols.Add(($"D_{axes[i / 3]}{axes[i % 3]}{(du == "1" ? "" : "_" + du)}", du, $"curvature dipole D_{axes[i / 3]}{axes[i % 3]} (derivative along {axes[i / 3]}, curvature component {axes[i % 3]})", Grid(r.ChemicalPotentials.Count, r.Temperatures.Count, (it, im) => r.Tensor[it, im][ii])));
        }
        var meta = new Dictionary<string, string>(metadata)
        {
            ["quantity"] = "Berry curvature dipole D_ab = Int d^dk/(2pi)^d sum_n f_n d_a Omega_n,b (Fermi-surface form, rigid bands)",
            ["energy_unit"] = unit.Symbol(), ["dipole_unit"] = du, ["mu0"] = mu0.ToString("R", CultureInfo.InvariantCulture),
            ["sampling"] = $"{r.Samples.Mesh}; {r.Samples.Count} samples, {r.Samples.RefinedCells} refined cells",
            ["point_group_order"] = r.PointGroupOrder.ToString(CultureInfo.InvariantCulture),
            ["forbidden_components"] = string.Join(" ", r.Forbidden ?? []),
        };
        Write(path, cols, meta);
    }

    private static List<(string Name, string Unit, string Meaning, double[] Values)> Base(IReadOnlyList<double> mu, IReadOnlyList<double> t, double mu0, EnergyUnit unit)
    {
        string u = unit.Symbol();
        return
        [
            ($"mu_{u}", u, "chemical potential (rigid bands)", Grid(mu.Count, t.Count, (_, im) => mu[im])),
            ($"mu_minus_mu0_{u}", u, "mu relative to the solution's mu0", Grid(mu.Count, t.Count, (_, im) => mu[im] - mu0)),
            ("temperature_K", "K", "temperature", Grid(mu.Count, t.Count, (it, _) => t[it] * unit.Kelvins())),
        ];
    }

    private static double[] Grid(int nMu, int nT, Func<int, int, double> value)
    {
        var v = new double[nMu * nT];
        for (int it = 0; it < nT; it++)
            for (int im = 0; im < nMu; im++) v[it * nMu + im] = value(it, im);
        return v;
    }

    private static void Write(string path, List<(string Name, string Unit, string Meaning, double[] Values)> cols, Dictionary<string, string> meta) =>
        ColumnTable.Write(path, meta.GetValueOrDefault("quantity") ?? "response", [.. meta],
                          [.. cols.Select(c => new TableData(new TableColumn(c.Name, c.Unit, c.Meaning), c.Values))]);
}
