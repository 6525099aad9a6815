namespace Meanfield.Lattices;

/// <summary>
/// The point operations of a Bravais lattice (its holohedry): the orthogonal maps R with R b_i in the reciprocal lattice
/// for every reciprocal primitive vector b_i. In reduced coordinates such an R is an integer matrix M with
/// R = B M B^-1 (B the matrix of columns b_i); for the conventional primitive bases every entry of M is -1, 0 or 1, so
/// the candidates are enumerated and the orthogonal ones kept (common practice; the cubic holohedry O_h has 48
/// elements, the hexagonal D_6h 24, the square D_4h 16 in 3D, 8 in the plane).
/// </summary>
/// <remarks>
/// These are the operations of the lattice only. Whether one is a symmetry of a model depends on its sites and terms;
/// the node search uses them to propose images of a found node and keeps an image only where the bands really touch.
/// </remarks>
public static class LatticeRotations
{
    /// <summary>Orthogonality tolerance of R^T R = 1 (dimensionless; the candidates are exact or far off).</summary>
    private const double OrthogonalityTolerance = 1e-8;

    /// <summary>
    /// Cartesian 3 x 3 rotation matrices (row-major) of the lattice's holohedry, identity first; for two-dimensional
    /// lattices only the operations that keep the plane (and z) fixed.
    /// </summary>
    /// <exception cref="ArgumentException">A lattice without momentum (dimension below 2).</exception>
    public static IReadOnlyList<double[]> Of(Lattice lattice)
    {
        if (lattice.Dimension < 2) throw new ArgumentException("a lattice without momentum has no point operations in k");
        var b = new[] { lattice.B1, lattice.B2, lattice.B3 };
        var bm = new double[9];
        for (int i = 0; i < 3; i++) for (int j = 0; j < 3; j++) bm[i * 3 + j] = b[j][i];
        var inv = Inverse(bm);
        var found = new List<double[]> { new double[] { 1, 0, 0, 0, 1, 0, 0, 0, 1 } };
        var m = new int[9];
        int dim = lattice.Dimension;
        for (int code = 0; code < 19683; code++)
        {
            int c = code;
            for (int e = 0; e < 9; e++) { m[e] = c % 3 - 1; c /= 3; }
            if (dim == 2 && (m[2] != 0 || m[5] != 0 || m[6] != 0 || m[7] != 0 || m[8] != 1)) continue;
            int det = m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
            if (Math.Abs(det) != 1) continue;
            var r = Multiply(Multiply(bm, ToDouble(m)), inv);
            if (!Orthogonal(r) || IsIdentity(r)) continue;
            found.Add(r);
        }
        return found;
    }

    /// <summary>R k for a row-major 3 x 3 matrix.</summary>
    public static Vec3 Apply(double[] r, Vec3 k) =>
        new(r[0] * k.X + r[1] * k.Y + r[2] * k.Z, r[3] * k.X + r[4] * k.Y + r[5] * k.Z, r[6] * k.X + r[7] * k.Y + r[8] * k.Z);

    private static double[] ToDouble(int[] m) => Array.ConvertAll(m, x => (double)x);

    private static double[] Multiply(double[] a, double[] b)
    {
        var c = new double[9];
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
                for (int k = 0; k < 3; k++) c[i * 3 + j] += a[i * 3 + k] * b[k * 3 + j];
        return c;
    }

    private static bool Orthogonal(double[] r)
    {
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
            {
                double s = 0;
                for (int k = 0; k < 3; k++) s += r[k * 3 + i] * r[k * 3 + j];
                if (Math.Abs(s - (i == j ? 1 : 0)) > OrthogonalityTolerance) return false;
            }
        return true;
    }

    private static bool IsIdentity(double[] r)
    {
        for (int i = 0; i < 9; i++) if (Math.Abs(r[i] - (i % 4 == 0 ? 1 : 0)) > OrthogonalityTolerance) return false;
        return true;
    }

    // Bravais matrices are never singular.
    private static double[] Inverse(double[] a)
    {
        var inv = new double[9];
        Numerics.Matrix3.TryInvert(a, inv);
        return inv;
    }
}
