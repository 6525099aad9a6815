using System.Globalization;
using Meanfield.Analysis.Curvature;

namespace Meanfield.Output;

/// <summary>
/// Writes a <see cref="BerryCurvatureMap"/>, one row per plaquette, CSV or Parquet by extension through
/// <see cref="ColumnTable"/>: i, j, s, t (plane coordinates of the plaquette centre, 0..1), u1, u2, u3 (reduced),
/// kx/ky/kz_per_angstrom, omega_angstrom2 (curvature along the plane normal), flux_rad (through the plaquette). The
/// header names the plane, its normal and the total flux.
/// </summary>
public static class CurvatureTableWriter
{
    /// <summary>The columns, in file order.</summary>
    public static readonly IReadOnlyList<TableColumn> Columns =
    [
        new("i", "1", "plaquette index along span1"), new("j", "1", "plaquette index along span2"),
        new("s", "1", "plane coordinate of the plaquette centre along span1, 0..1"), new("t", "1", "plane coordinate along span2, 0..1"),
        new("u1", "1", "reduced coordinate along b1"), new("u2", "1", "reduced coordinate along b2"), new("u3", "1", "reduced coordinate along b3"),
        new("kx_per_angstrom", "1/angstrom", "Cartesian k_x"), new("ky_per_angstrom", "1/angstrom", "Cartesian k_y"), new("kz_per_angstrom", "1/angstrom", "Cartesian k_z"),
        new("omega_angstrom2", "angstrom^2", "Berry curvature of the occupied bands along the plane normal"),
        new("flux_rad", "rad", "Berry flux through the plaquette"),
    ];

    /// <summary>Writes <paramref name="map"/> to <paramref name="path"/> (.csv or .parquet) with <paramref name="metadata"/> in the header.</summary>
    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(BerryCurvatureMap map, string path, IEnumerable<KeyValuePair<string, string>>? metadata = null)
    {
        var inv = CultureInfo.InvariantCulture;
        int rows = map.N1 * map.N2;
        var ii = new int[rows]; var jj = new int[rows];
        var v = new double[10][];
        for (int c = 0; c < 10; c++) v[c] = new double[rows];
        for (int i = 0, r = 0; i < map.N1; i++)
            for (int j = 0; j < map.N2; j++, r++)
            {
                var u = map.CentreReduced[i, j]; var k = map.CentreCartesian[i, j];
                ii[r] = i; jj[r] = j;
                v[0][r] = (i + 0.5) / map.N1; v[1][r] = (j + 0.5) / map.N2;
                v[2][r] = u.X; v[3][r] = u.Y; v[4][r] = u.Z; v[5][r] = k.X; v[6][r] = k.Y; v[7][r] = k.Z;
                v[8][r] = map.Omega[i, j]; v[9][r] = map.Flux[i, j];
            }
        var meta = new List<KeyValuePair<string, string>>
        {
            new("occupied_bands", map.OccupiedBands.ToString(inv)),
            new("plane_origin_reduced", map.Origin.ToString()), new("plane_span1_reduced", map.Span1.ToString()), new("plane_span2_reduced", map.Span2.ToString()),
            new("plane_normal", map.Normal.ToString()),
            new("total_flux_over_2pi", map.TotalFluxOver2Pi.ToString("R", inv)),
        };
        if (map.IsFullTorus) meta.Add(new("chern_number", map.ChernNumber.ToString()));
        if (metadata is not null) meta.AddRange(metadata);
        var data = new List<TableData> { new(Columns[0], ii), new(Columns[1], jj) };
        for (int c = 0; c < 10; c++) data.Add(new(Columns[2 + c], v[c]));
        ColumnTable.Write(path, $"Berry curvature of the {map.OccupiedBands} lowest bands on a plane of the zone", meta, data);
    }
}
