using Meanfield.Analysis.Bands;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// Writes a <see cref="BandStructure"/> as a long table, one row per (k-point, band), CSV or Parquet by extension,
/// through <see cref="ColumnTable"/> (units in the CSV's '#' lines, in the Parquet file metadata and in each column's
/// own metadata). Columns: k_index, path_length_per_angstrom, kx/ky/kz_per_angstrom, label (path vertex label, empty
/// elsewhere; "G" is the zone centre), band (0 = lowest), energy_E and energy_minus_mu_E (E the model's energy unit;
/// the latter when mu is given), f_weight (correlated-orbital weight, 0..1).
/// </summary>
public static class BandTableWriter
{
    /// <summary>The columns for energy unit <paramref name="unit"/>, with or without the energy_minus_mu column.</summary>
    public static IReadOnlyList<TableColumn> Columns(EnergyUnit unit, bool withMu = true)
    {
        string u = unit.Symbol();
        var c = new List<TableColumn>
        {
            new("k_index", "1", "index of the k-point along the path"),
            new("path_length_per_angstrom", "1/angstrom", "distance along the path"),
            new("kx_per_angstrom", "1/angstrom", "Cartesian k_x"), new("ky_per_angstrom", "1/angstrom", "Cartesian k_y"), new("kz_per_angstrom", "1/angstrom", "Cartesian k_z"),
            new("label", "text", "zone point label at path vertices (G = zone centre), empty elsewhere"),
            new("band", "1", "band index, 0 = lowest"),
            new($"energy_{u}", u, "band energy"),
        };
        if (withMu) c.Add(new($"energy_minus_mu_{u}", u, "band energy relative to the chemical potential"));
        c.Add(new("f_weight", "1", "correlated-orbital weight of the state, 0..1"));
        return c;
    }

    /// <summary>
    /// Writes <paramref name="bands"/> to <paramref name="path"/> (.csv or .parquet); <paramref name="metadata"/> goes
    /// into the header and key-value store; <paramref name="mu"/>, when given, adds energy_minus_mu.
    /// </summary>
    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(BandStructure bands, string path, IEnumerable<KeyValuePair<string, string>>? metadata = null, double? mu = null)
    {
        var b = bands;
        int nk = b.KCount, nb = b.BandCount, rows = nk * nb;
        var kIndex = new int[rows]; var band = new int[rows];
        var len = new double[rows]; var kx = new double[rows]; var ky = new double[rows]; var kz = new double[rows];
        var label = new string[rows]; var energy = new double[rows]; var rel = new double[rows]; var fw = new double[rows];
        for (int k = 0, r = 0; k < nk; k++)
            for (int n = 0; n < nb; n++, r++)
            {
                var q = b.Path.K[k];
                kIndex[r] = k; len[r] = b.Path.Length[k]; kx[r] = q.X; ky[r] = q.Y; kz[r] = q.Z;
                label[r] = b.Path.Labels[k]; band[r] = n; energy[r] = b.Energy(k, n); rel[r] = energy[r] - (mu ?? 0); fw[r] = b.CorrelatedWeight(k, n);
            }
        var cols = Columns(b.Unit, mu is not null);
        var data = new List<TableData>
        {
            new(cols[0], kIndex), new(cols[1], len), new(cols[2], kx), new(cols[3], ky), new(cols[4], kz),
            new(cols[5], label), new(cols[6], band), new(cols[7], energy),
        };
        if (mu is not null) data.Add(new(cols[8], rel));
        data.Add(new(cols[^1], fw));
        var meta = new List<KeyValuePair<string, string>>
        {
            new("energy_unit", b.Unit.Symbol()),
            new("band_path", string.Join(" ", b.Path.Ticks.Select(t => t.Label))),
        };
        if (metadata is not null) meta.AddRange(metadata);
        ColumnTable.Write(path, $"band structure along {string.Join(" ", b.Path.Ticks.Select(t => t.Label))}", meta, data);
    }
}
