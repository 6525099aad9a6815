using System.Globalization;
using System.Text;
using Meanfield.Analysis.Surfaces;
using Meanfield.Units;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output.Surfaces;

/// <summary>
/// Writes a <see cref="SurfaceReport"/> as a long table, CSV or Parquet by extension, through a temporary file.
/// Slab view: one row per (k-point, slab band): k_index, path_length, kx, ky, kz, label, band, energy,
/// energy_minus_mu, top_weight, bottom_weight. Spectrum view: one row per (k-point, energy): k_index, path_length,
/// kx, ky, kz, label, energy, energy_minus_mu, surface, bulk. Arcs view: one row per map point: i, j, s1, s2, kx, ky,
/// kz, surface, bulk. Every name with a unit ends in it (energy_meV, kx_per_angstrom, surface_per_meV: states per
/// energy unit per surface cell and principal layer). Written through <see cref="ColumnTable"/>: units in the CSV's
/// '#' lines and in the Parquet file and column metadata, with the facts of <see cref="SurfaceStudy.Facts"/>.
/// </summary>
public static class SurfaceTableWriter
{
    private sealed record Column(string Name, string Unit, Array Values);

    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(SurfaceReport report, string path, IEnumerable<KeyValuePair<string, string>>? metadata = null)
    {
        var ext = System.IO.Path.GetExtension(path).ToLowerInvariant();
        if (ext is not (".csv" or ".parquet")) throw new ArgumentException($"surface table '{path}': unknown extension '{ext}'; use .csv or .parquet");
        var columns = Columns(report);
        var facts = SurfaceStudy.Facts(report).ToList();
        if (metadata != null) facts.AddRange(metadata);
        // A fact given more than once (notes) keeps every value.
        var merged = new List<KeyValuePair<string, string>>();
        foreach (var (key, value) in facts)
        {
            int i = merged.FindIndex(kv => kv.Key == key);
            if (i < 0) merged.Add(new(key, value)); else merged[i] = new(key, merged[i].Value + " | " + value);
        }
        ColumnTable.Write(path, $"surface {report.Request.View.ToString().ToLowerInvariant()}", merged,
            [.. columns.Select(c => new TableData(new TableColumn(Suffixed(c.Name, c.Unit), c.Unit.Length == 0 ? (c.Values is string[] ? "text" : "1") : c.Unit, Meaning(c.Name)), c.Values))]);
    }

    /// <summary>The column name with its unit: energy_meV, kx_per_angstrom, surface_per_meV.</summary>
    private static string Suffixed(string name, string unit) =>
        unit.Length == 0 ? name : name + "_" + (unit.StartsWith("1/", StringComparison.Ordinal) ? "per_" + unit[2..] : unit);

    private static string Meaning(string name) => name switch
    {
        "k_index" => "index of the k-point along the path", "path_length" => "distance along the path",
        "kx" or "ky" or "kz" => $"Cartesian k_{name[1]}", "label" => "zone point label at path vertices, empty elsewhere",
        "band" => "slab band index, 0 = lowest", "energy" => "energy", "energy_minus_mu" => "energy relative to the chemical potential",
        "top_weight" => "weight of the state on the top face", "bottom_weight" => "weight of the state on the bottom face",
        "surface" => "surface spectral function, states per energy unit per surface cell and principal layer",
        "bulk" => "bulk-projected spectral function, same unit", "i" => "map index along s1", "j" => "map index along s2",
        "s1" => "surface-zone coordinate along the first in-plane axis", "s2" => "surface-zone coordinate along the second in-plane axis",
        _ => name,
    };

    private static List<Column> Columns(SurfaceReport r)
    {
        string e = r.Cut.Model.Unit.Symbol(), k = "1/angstrom", a = $"1/{e}";
        double mu = r.ChemicalPotential;
        if (r.Slab is { } s)
        {
            int nk = s.Path.Count, nb = s.Bands, rows = nk * nb;
            var cols = PathColumns(s.Path, nb, k);
            var band = new int[rows]; var en = new double[rows]; var rel = new double[rows]; var top = new double[rows]; var bottom = new double[rows];
            for (int i = 0, row = 0; i < nk; i++)
                for (int n = 0; n < nb; n++, row++)
                { band[row] = n; en[row] = s.Energy(i, n); rel[row] = en[row] - mu; top[row] = s.Top(i, n); bottom[row] = s.Bottom(i, n); }
            cols.AddRange([new("band", "", band), new("energy", e, en), new("energy_minus_mu", e, rel), new("top_weight", "", top), new("bottom_weight", "", bottom)]);
            return cols;
        }
        if (r.Spectrum is { } p)
        {
            int nk = p.Path.Count, ne = p.Energies.Length, rows = nk * ne;
            var cols = PathColumns(p.Path, ne, k);
            var en = new double[rows]; var rel = new double[rows]; var sf = new double[rows]; var bk = new double[rows];
            for (int i = 0, row = 0; i < nk; i++)
                for (int j = 0; j < ne; j++, row++)
                { en[row] = p.Energies[j]; rel[row] = en[row] - mu; sf[row] = p.Surface[i, j]; bk[row] = p.Bulk[i, j]; }
            cols.AddRange([new("energy", e, en), new("energy_minus_mu", e, rel), new("surface", a, sf), new("bulk", a, bk)]);
            return cols;
        }
        var m = r.Map!;
        int n1 = m.S1.Length, n2 = m.S2.Length, count = n1 * n2;
        var ii = new int[count]; var jj = new int[count]; var s1 = new double[count]; var s2 = new double[count];
        var kx = new double[count]; var ky = new double[count]; var kz = new double[count]; var su = new double[count]; var bu = new double[count];
        for (int i = 0, row = 0; i < n1; i++)
            for (int j = 0; j < n2; j++, row++)
            {
                var q = r.Cut.Zone.FromMap(m.S1[i], m.S2[j]);
                ii[row] = i; jj[row] = j; s1[row] = m.S1[i]; s2[row] = m.S2[j]; kx[row] = q.X; ky[row] = q.Y; kz[row] = q.Z;
                su[row] = m.Surface[i, j]; bu[row] = m.Bulk[i, j];
            }
        return [new("i", "", ii), new("j", "", jj), new("s1", k, s1), new("s2", k, s2), new("kx", k, kx), new("ky", k, ky), new("kz", k, kz),
                new("surface", a, su), new("bulk", a, bu)];
    }

    private static List<Column> PathColumns(Lattices.BandPathSample path, int repeat, string k)
    {
        int rows = path.Count * repeat;
        var idx = new int[rows]; var len = new double[rows]; var kx = new double[rows]; var ky = new double[rows]; var kz = new double[rows];
        var label = new string[rows];
        for (int i = 0, row = 0; i < path.Count; i++)
            for (int j = 0; j < repeat; j++, row++)
            { idx[row] = i; len[row] = path.Length[i]; kx[row] = path.K[i].X; ky[row] = path.K[i].Y; kz[row] = path.K[i].Z; label[row] = path.Labels[i]; }
        return [new("k_index", "", idx), new("path_length", k, len), new("kx", k, kx), new("ky", k, ky), new("kz", k, kz), new("label", "", label)];
    }

}
