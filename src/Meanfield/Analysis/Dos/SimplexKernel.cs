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

    /// <summary>Occupied fraction n(E) and D(E) = dn/dE of a tetrahedron in one evaluation (sorted corner energies).</summary>
    public static (double Fraction, double D) TetraFractionAndDensity(ReadOnlySpan<double> e, double E)
    {
        if (E <= e[0]) return (0, 0);
        if (E >= e[3]) return (1, 0);
        double e21 = e[1] - e[0], e31 = e[2] - e[0], e41 = e[3] - e[0];
        if (E < e[1]) { double x = E - e[0], c = 1 / (e21 * e31 * e41); return (x * x * x * c, 3 * x * x * c); }
        double e42 = e[3] - e[1];
        if (E < e[2])
        {
            double e32 = e[2] - e[1], y = E - e[1], a = (e31 + e42) / (e32 * e42), c = 1 / (e31 * e41);
            return ((e21 * e21 + 3 * e21 * y + 3 * y * y - a * y * y * y) * c, (3 * e21 + 6 * y - 3 * a * y * y) * c);
        }
        double z = e[3] - E, d = 1 / (e41 * e42 * (e[3] - e[2]));
        return (1 - z * z * z * d, 3 * z * z * d);
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

    /// <summary>
    /// Integration weights w_i(E) of a tetrahedron (sorted corner energies e, per tetrahedron volume): the integral of
    /// corner i's linear interpolation weight over the part of the tetrahedron below E, so that for any F interpolated
    /// linearly between the corners the occupied integral is sum_i w_i F_i, and sum_i w_i equals
    /// <see cref="TetraFraction"/>. dw_i/dE is the corner weight of <see cref="TetraCornerWeights"/> without the
    /// correction. Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994), App. B (with V_T / V_G = 1).
    /// Cases are chosen by strict inequalities, so no denominator vanishes for degenerate corners. Returns sum_i w_i.
    /// </summary>
    public static double TetraIntegrationWeights(ReadOnlySpan<double> e, double E, Span<double> w)
    {
        if (E <= e[0]) { w[..4].Clear(); return 0; }
        if (E >= e[3]) { w[..4].Fill(0.25); return 1; }
        double e21 = e[1] - e[0], e31 = e[2] - e[0], e41 = e[3] - e[0], e32 = e[2] - e[1], e42 = e[3] - e[1], e43 = e[3] - e[2];
        if (E < e[1])
        {
            double x = E - e[0], c = 0.25 * x * x * x / (e21 * e31 * e41);
            w[0] = c * (4 - x * (1 / e21 + 1 / e31 + 1 / e41)); w[1] = c * x / e21; w[2] = c * x / e31; w[3] = c * x / e41;
            return 4 * c;
        }
        if (E < e[2])
        {
            double a = E - e[0], b = E - e[1], u = e[2] - E, v = e[3] - E;
            double c1 = 0.25 * a * a / (e41 * e31), c2 = 0.25 * a * b * u / (e41 * e32 * e31), c3 = 0.25 * b * b * v / (e42 * e32 * e41);
            w[0] = c1 + (c1 + c2) * u / e31 + (c1 + c2 + c3) * v / e41;
            w[1] = c1 + c2 + c3 + (c2 + c3) * u / e32 + c3 * v / e42;
            w[2] = (c1 + c2) * a / e31 + (c2 + c3) * b / e32;
            w[3] = (c1 + c2 + c3) * a / e41 + c3 * b / e42;
            return w[0] + w[1] + w[2] + w[3];
        }
        double z = e[3] - E, d = 0.25 * z * z * z / (e41 * e42 * e43);
        w[0] = 0.25 - d * z / e41; w[1] = 0.25 - d * z / e42; w[2] = 0.25 - d * z / e43;
        w[3] = 0.25 - d * (4 - z * (1 / e41 + 1 / e42 + 1 / e43));
        return 1 - 4 * d;
    }

    /// <summary>
    /// Integration weights of a triangle (sorted corner energies, per triangle area): the integral of each corner's
    /// barycentric coordinate over the part below E. The occupied (or empty) part is a small triangle at the lowest
    /// (highest) corner whose barycentric means are the averages over its vertices (linear triangle method, common
    /// practice; no Bloechl-type correction in 2D). Returns sum_i w_i = <see cref="TriangleFraction"/>.
    /// </summary>
    public static double TriangleIntegrationWeights(ReadOnlySpan<double> e, double E, Span<double> w)
    {
        if (E <= e[0]) { w[..3].Clear(); return 0; }
        if (E >= e[2]) { w[..3].Fill(1.0 / 3); return 1; }
        if (E < e[1])
        {
            double t1 = (E - e[0]) / (e[1] - e[0]), t2 = (E - e[0]) / (e[2] - e[0]), f = t1 * t2;
            w[0] = f * (3 - t1 - t2) / 3; w[1] = f * t1 / 3; w[2] = f * t2 / 3;
            return f;
        }
        double s0 = (e[2] - E) / (e[2] - e[0]), s1 = (e[2] - E) / (e[2] - e[1]), u = s0 * s1;
        w[0] = 1.0 / 3 - u * s0 / 3; w[1] = 1.0 / 3 - u * s1 / 3; w[2] = 1.0 / 3 - u * (3 - s0 - s1) / 3;
        return 1 - u;
    }

    /// <summary>D(E) = dn/dE of a triangle (sorted corner energies, per triangle area).</summary>
    public static double TriangleDensity(ReadOnlySpan<double> e, double E)
    {
        if (E <= e[0] || E >= e[2]) return 0;
        if (E < e[1]) return 2 * (E - e[0]) / ((e[1] - e[0]) * (e[2] - e[0]));
        return 2 * (e[2] - E) / ((e[2] - e[0]) * (e[2] - e[1]));
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
