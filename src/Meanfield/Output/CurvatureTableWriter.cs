using System.Globalization;
using System.Text;
using Meanfield.Analysis.Curvature;

namespace Meanfield.Output;

/// <summary>
/// Writes a <see cref="BerryCurvatureMap"/> as CSV, one row per plaquette: i, j, s, t (plane coordinates of the
/// plaquette centre, 0..1), u1, u2, u3 (reduced), kx, ky, kz (1/angstrom), omega (curvature along the plane normal,
/// square angstrom), flux (radians). The '#' header names the plane, normal, units and total flux. Written atomically.
/// </summary>
public static class CurvatureTableWriter
{
    public static readonly string[] Columns = ["i", "j", "s", "t", "u1", "u2", "u3", "kx", "ky", "kz", "omega", "flux"];

    public static void Write(BerryCurvatureMap map, string path, IReadOnlyDictionary<string, string>? metadata = null)
    {
        var ext = Path.GetExtension(path).ToLowerInvariant();
        if (ext != ".csv") throw new ArgumentException($"Curvature table '{path}': unknown extension '{ext}'; use .csv.");
        var inv = CultureInfo.InvariantCulture;
        AtomicFile.Write(path, stream =>
        {
            using var w = new StreamWriter(stream, new UTF8Encoding(false), 1 << 16);
            w.Write(string.Create(inv,
                $"# Berry curvature of the {map.OccupiedBands} lowest bands; plane origin {map.Origin}, span1 {map.Span1}, span2 {map.Span2} (reduced); unit normal {map.Normal}; omega in angstrom^2 along the normal; flux in rad; k in 1/angstrom; total flux / 2pi = {map.TotalFluxOver2Pi:G8}"));
            if (map.IsFullTorus) w.Write($"; Chern number {map.ChernNumber}");
            if (metadata != null) foreach (var (k, v) in metadata) w.Write($"; {k}={v.Replace('\n', ' ')}");
            w.WriteLine();
            w.WriteLine(string.Join(",", Columns));
            for (int i = 0; i < map.N1; i++)
                for (int j = 0; j < map.N2; j++)
                {
                    var r = map.CentreReduced[i, j];
                    var c = map.CentreCartesian[i, j];
                    w.WriteLine(string.Create(inv,
                        $"{i},{j},{(i + 0.5) / map.N1:R},{(j + 0.5) / map.N2:R},{r.X:R},{r.Y:R},{r.Z:R},{c.X:R},{c.Y:R},{c.Z:R},{map.Omega[i, j]:R},{map.Flux[i, j]:R}"));
                }
        });
    }
}
