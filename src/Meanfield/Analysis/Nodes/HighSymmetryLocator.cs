using Meanfield.Lattices;

namespace Meanfield.Analysis.Nodes;

/// <summary>
/// Names the high-symmetry point or line a wave vector lies on, for the cubic lattices. Points in Cartesian units of
/// 2 pi / a (Setyawan &amp; Curtarolo, Comput. Mater. Sci. 49, 299 (2010)); a wave vector matches when some cubic point
/// operation (the 48 signed permutations) maps it onto the point or segment up to a reciprocal lattice vector.
/// </summary>
public static class HighSymmetryLocator
{
    private static readonly (string, Vec3)[] Sc = [("Gamma", new(0, 0, 0)), ("X", new(0, 0.5, 0)), ("M", new(0.5, 0.5, 0)), ("R", new(0.5, 0.5, 0.5))];
    private static readonly (string, Vec3)[] Fcc =
        [("Gamma", new(0, 0, 0)), ("X", new(0, 1, 0)), ("W", new(0.5, 1, 0)), ("L", new(0.5, 0.5, 0.5)), ("K", new(0.75, 0.75, 0)), ("U", new(0.25, 1, 0.25))];
    private static readonly (string, Vec3)[] Bcc = [("Gamma", new(0, 0, 0)), ("H", new(0, 0, 1)), ("N", new(0.5, 0.5, 0)), ("P", new(0.5, 0.5, 0.5))];
    private static readonly string[] ScLines = ["Gamma-X", "Gamma-M", "Gamma-R", "X-M", "X-R", "M-R"];
    private static readonly string[] FccLines = ["Gamma-X", "Gamma-L", "Gamma-K", "X-W", "X-U", "W-K", "L-W", "L-U", "K-W"];
    private static readonly string[] BccLines = ["Gamma-H", "Gamma-N", "Gamma-P", "H-N", "H-P", "N-P"];

    /// <summary>"X" for a point, "on X-W" for a line, or null (also for non-cubic lattices).</summary>
    public static string? Locate(Lattice lattice, Vec3 k, double tolerance = 1e-6)
    {
        var (points, lines) = lattice.Kind switch
        {
            LatticeKind.SimpleCubic => (Sc, ScLines),
            LatticeKind.FaceCentredCubic or LatticeKind.Diamond => (Fcc, FccLines),
            LatticeKind.BodyCentredCubic => (Bcc, BccLines),
            _ => (null, null),
        };
        if (points is null || lines is null) return null;
        var kc = k * (lattice.Constant / (2 * Math.PI));
        foreach (var (name, p) in points)
            if (Matches(lattice, kc, p, p, tolerance)) return name;
        foreach (var line in lines)
        {
            var ends = line.Split('-');
            Vec3 p = Find(points, ends[0]), q = Find(points, ends[1]);
            if (Matches(lattice, kc, p, q, tolerance)) return "on " + line;
        }
        return null;
    }

    private static Vec3 Find((string, Vec3)[] points, string name)
    {
        foreach (var (n, p) in points) if (n == name) return p;
        throw new InvalidOperationException(name);
    }

    // Is some g(kc) - G on the segment p-q (units 2 pi / a)?
    private static bool Matches(Lattice lattice, Vec3 kc, Vec3 p, Vec3 q, double tol)
    {
        double scale = lattice.Constant / (2 * Math.PI);
        Vec3 b1 = lattice.B1 * scale, b2 = lattice.B2 * scale, b3 = lattice.B3 * scale;
        var d = q - p;
        double dd = d.Dot(d);
        foreach (var g in CubicImages(kc))
            for (int n1 = -2; n1 <= 2; n1++)
                for (int n2 = -2; n2 <= 2; n2++)
                    for (int n3 = -2; n3 <= 2; n3++)
                    {
                        var x = g - n1 * b1 - n2 * b2 - n3 * b3 - p;
                        double lam = dd > 0 ? Math.Clamp(x.Dot(d) / dd, 0, 1) : 0;
                        if ((x - lam * d).Norm < tol) return true;
                    }
        return false;
    }

    private static IEnumerable<Vec3> CubicImages(Vec3 v)
    {
        int[][] perms = [[0, 1, 2], [0, 2, 1], [1, 0, 2], [1, 2, 0], [2, 0, 1], [2, 1, 0]];
        foreach (var p in perms)
            for (int s = 0; s < 8; s++)
                yield return new Vec3((s & 1) == 0 ? v[p[0]] : -v[p[0]], (s & 2) == 0 ? v[p[1]] : -v[p[1]], (s & 4) == 0 ? v[p[2]] : -v[p[2]]);
    }
}
