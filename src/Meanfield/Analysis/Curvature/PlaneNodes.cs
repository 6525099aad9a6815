using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Curvature;

/// <summary>A node lying in a curvature plane, at plane coordinates (s, t) in [0, 1]^2 (k = origin + s span1 + t span2).</summary>
public readonly record struct PlaneNode(double S, double T, int? Chirality, WeylNode Node);

/// <summary>Finds which nodes lie in a plane of the zone, modulo reciprocal lattice vectors.</summary>
public static class PlaneNodes
{
    /// <summary>
    /// Nodes within <paramref name="tolerance"/> (1/angstrom) of the plane segment origin + [0,1] span1 + [0,1] span2
    /// (reduced coordinates), for any image node + G with G in {-2..2}^3.
    /// </summary>
    public static IReadOnlyList<PlaneNode> Find(Lattice lattice, Vec3 origin, Vec3 span1, Vec3 span2, IEnumerable<WeylNode> nodes, double tolerance)
    {
        Vec3 c1 = lattice.Cartesian(span1.X, span1.Y, span1.Z), c2 = lattice.Cartesian(span2.X, span2.Y, span2.Z);
        var normal = c1.Cross(c2);
        double nn = normal.Norm;
        if (!(nn > 0)) return [];
        var unit = normal / nn;
        var o = lattice.Cartesian(origin.X, origin.Y, origin.Z);
        var found = new List<PlaneNode>();
        int r3 = lattice.Dimension == 3 ? 2 : 0;
        foreach (var node in nodes)
            for (int a = -2; a <= 2; a++)
                for (int b = -2; b <= 2; b++)
                    for (int c = -r3; c <= r3; c++)
                    {
                        var d = node.Cartesian + lattice.Cartesian(a, b, c) - o;
                        if (Math.Abs(d.Dot(unit)) > tolerance) continue;
                        // d = s c1 + t c2 in the plane: Cramer's rule with the normal.
                        double s = d.Cross(c2).Dot(unit) / nn, t = c1.Cross(d).Dot(unit) / nn;
                        const double e = 1e-9;
                        if (s < -e || s > 1 + e || t < -e || t > 1 + e) continue;
                        if (found.Any(p => p.Node == node && Math.Abs(p.S - s) < 1e-6 && Math.Abs(p.T - t) < 1e-6)) continue;
                        found.Add(new PlaneNode(s, t, node.Chirality, node));
                    }
        return found;
    }
}
