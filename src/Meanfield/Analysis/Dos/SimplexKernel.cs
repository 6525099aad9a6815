namespace Meanfield.Analysis.Dos;

/// <summary>
/// Linear tetrahedron (3D) and linear triangle (2D) formulas for one simplex whose corner energies are sorted
/// ascending. Values are per simplex volume: the occupied fraction n(E) in [0, 1], its derivative D(E) = dn/dE, and
/// corner weights g_i(E) with sum_i g_i = D, which distribute D over the corners for projections.
/// Lehmann &amp; Taut, Phys. Status Solidi B 54, 469 (1972); Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994), App. B.
/// </summary>
public static class SimplexKernel
{
    /// <summary>Occupied fraction of a tetrahedron below E (sorted corner energies e).</summary>
    public static double TetraFraction(ReadOnlySpan<double> e, double E)
    {
        if (E <= e[0]) return 0;
        if (E >= e[3]) return 1;
        double e21 = e[1] - e[0], e31 = e[2] - e[0], e41 = e[3] - e[0], e32 = e[2] - e[1], e42 = e[3] - e[1], e43 = e[3] - e[2];
        if (E < e[1]) { double x = E - e[0]; return x * x * x / (e21 * e31 * e41); }
        if (E < e[2])
        {
            double y = E - e[1];
            return (e21 * e21 + 3 * e21 * y + 3 * y * y - (e31 + e42) / (e32 * e42) * y * y * y) / (e31 * e41);
        }
        double z = e[3] - E;
        return 1 - z * z * z / (e41 * e42 * e43);
    }

    /// <summary>D(E) = dn/dE of a tetrahedron and its slope dD/dE (needed by Bloechl's correction).</summary>
    public static (double D, double Slope) TetraDensity(ReadOnlySpan<double> e, double E)
    {
        if (E <= e[0] || E >= e[3]) return (0, 0);
        double e21 = e[1] - e[0], e31 = e[2] - e[0], e41 = e[3] - e[0], e32 = e[2] - e[1], e42 = e[3] - e[1], e43 = e[3] - e[2];
        if (E < e[1]) { double x = E - e[0], c = 1 / (e21 * e31 * e41); return (3 * x * x * c, 6 * x * c); }
        if (E < e[2])
        {
            double y = E - e[1], a = (e31 + e42) / (e32 * e42), c = 1 / (e31 * e41);
            return ((3 * e21 + 6 * y - 3 * a * y * y) * c, (6 - 6 * a * y) * c);
        }
        double z = e[3] - E, d = 1 / (e41 * e42 * e43);
        return (3 * z * z * d, -6 * z * d);
    }

    /// <summary>
    /// Corner weights g_i(E) (sorted order) of a tetrahedron: D(E) times the mean of the linear interpolation weights
    /// over the constant-energy cross-section. With <paramref name="bloechl"/> adds Bloechl's correction
    /// dg_i = (dD/dE / 40) sum_j (e_j - e_i) (the E-derivative of Bloechl et al. 1994, Eq. 22), which sums to zero.
    /// Returns D(E).
    /// </summary>
    public static double TetraCornerWeights(ReadOnlySpan<double> e, double E, Span<double> g, bool bloechl)
    {
        g[..4].Clear();
        var (D, slope) = TetraDensity(e, E);
        if (D == 0 && slope == 0) return 0;
        if (E < e[1])
        {
            double t2 = (E - e[0]) / (e[1] - e[0]), t3 = (E - e[0]) / (e[2] - e[0]), t4 = (E - e[0]) / (e[3] - e[0]);
            g[0] = D * (3 - t2 - t3 - t4) / 3; g[1] = D * t2 / 3; g[2] = D * t3 / 3; g[3] = D * t4 / 3;
        }
        else if (E < e[2])
            QuadrilateralWeights(e, E, D, g);
        else
        {
            double s1 = (e[3] - E) / (e[3] - e[0]), s2 = (e[3] - E) / (e[3] - e[1]), s3 = (e[3] - E) / (e[3] - e[2]);
            g[0] = D * s1 / 3; g[1] = D * s2 / 3; g[2] = D * s3 / 3; g[3] = D * (3 - s1 - s2 - s3) / 3;
        }
        if (bloechl)
        {
            double sum = e[0] + e[1] + e[2] + e[3];
            for (int i = 0; i < 4; i++) g[i] += slope / 40 * (sum - 4 * e[i]);
        }
        return D;
    }

    // For e2 < E < e3 the section is the quadrilateral P13-P14-P24-P23; split it into two triangles whose area ratio
    // is computed in the reference tetrahedron (area ratios in a plane are invariant under affine maps).
    private static void QuadrilateralWeights(ReadOnlySpan<double> e, double E, double D, Span<double> g)
    {
        double t13 = (E - e[0]) / (e[2] - e[0]), t14 = (E - e[0]) / (e[3] - e[0]);
        double t24 = (E - e[1]) / (e[3] - e[1]), t23 = (E - e[1]) / (e[2] - e[1]);
        // Barycentric (l1..l4) -> reference coordinates (l2, l3, l4).
        Span<double> p13 = [0, t13, 0], p14 = [0, 0, t14], p24 = [1 - t24, 0, t24], p23 = [1 - t23, t23, 0];
        double a1 = TriangleArea(p13, p14, p24), a2 = TriangleArea(p13, p24, p23), a = a1 + a2;
        double w1 = a > 1e-300 ? a1 / a : 0.5, w2 = 1 - w1;
        // Mean barycentric weight per corner over each triangle = mean over its vertices.
        g[0] = D * (w1 * ((1 - t13) + (1 - t14)) + w2 * (1 - t13)) / 3;
        g[1] = D * (w1 * (1 - t24) + w2 * ((1 - t24) + (1 - t23))) / 3;
        g[2] = D * (w1 * t13 + w2 * (t13 + t23)) / 3;
        g[3] = D * (w1 * (t14 + t24) + w2 * t24) / 3;
    }

    private static double TriangleArea(ReadOnlySpan<double> a, ReadOnlySpan<double> b, ReadOnlySpan<double> c)
    {
        double ux = b[0] - a[0], uy = b[1] - a[1], uz = b[2] - a[2], vx = c[0] - a[0], vy = c[1] - a[1], vz = c[2] - a[2];
        double cx = uy * vz - uz * vy, cy = uz * vx - ux * vz, cz = ux * vy - uy * vx;
        return 0.5 * Math.Sqrt(cx * cx + cy * cy + cz * cz);
    }

    /// <summary>Occupied fraction of a triangle below E (linear triangle method, sorted corner energies).</summary>
    public static double TriangleFraction(ReadOnlySpan<double> e, double E)
    {
        if (E <= e[0]) return 0;
        if (E >= e[2]) return 1;
        if (E < e[1]) { double x = E - e[0]; return x * x / ((e[1] - e[0]) * (e[2] - e[0])); }
        double z = e[2] - E;
        return 1 - z * z / ((e[2] - e[0]) * (e[2] - e[1]));
    }

    /// <summary>Corner weights of a triangle (mean interpolation weight over the iso-energy segment times D); returns D.</summary>
    public static double TriangleCornerWeights(ReadOnlySpan<double> e, double E, Span<double> g)
    {
        g[..3].Clear();
        if (E <= e[0] || E >= e[2]) return 0;
        double D;
        if (E < e[1])
        {
            double e21 = e[1] - e[0], e31 = e[2] - e[0], t2 = (E - e[0]) / e21, t3 = (E - e[0]) / e31;
            D = 2 * (E - e[0]) / (e21 * e31);
            g[0] = D * (2 - t2 - t3) / 2; g[1] = D * t2 / 2; g[2] = D * t3 / 2;
        }
        else
        {
            double e31 = e[2] - e[0], e32 = e[2] - e[1], s1 = (e[2] - E) / e31, s2 = (e[2] - E) / e32;
            D = 2 * (e[2] - E) / (e31 * e32);
            g[0] = D * s1 / 2; g[1] = D * s2 / 2; g[2] = D * (2 - s1 - s2) / 2;
        }
        return D;
    }
}
