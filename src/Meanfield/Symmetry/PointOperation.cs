using System.Globalization;
using Meanfield.Lattices;

namespace Meanfield.Symmetry;

/// <summary>
/// A point operation of a Bravais lattice: an orthogonal Cartesian matrix R (row-major, proper or improper) that maps
/// the lattice onto itself, with its integer form in lattice coordinates (R a_j = sum_i M_ij a_i) and a name in
/// Hermann-Mauguin style with the axis: "1", "-1", "2[001]", "3[111]", "-4[001]", "m[1-10]" (m: the mirror's normal).
/// </summary>
public sealed class PointOperation
{
    /// <summary>Cartesian matrix, row-major.</summary>
    public double[] Rotation { get; }
    /// <summary>Integer matrix in lattice coordinates.</summary>
    public IntMatrix3 LatticeMatrix { get; }
    /// <summary>+1 for rotations, -1 for mirrors, inversion and rotoinversions.</summary>
    public int Determinant { get; }
    public string Name { get; }

    internal PointOperation(double[] rotation, IntMatrix3 latticeMatrix)
    {
        Rotation = rotation; LatticeMatrix = latticeMatrix; Determinant = latticeMatrix.Determinant;
        Name = NameOf(rotation, Determinant, Trace);
    }

    /// <summary>Cartesian R v.</summary>
    public Vec3 Apply(Vec3 v) => new(
        Rotation[0] * v.X + Rotation[1] * v.Y + Rotation[2] * v.Z,
        Rotation[3] * v.X + Rotation[4] * v.Y + Rotation[5] * v.Z,
        Rotation[6] * v.X + Rotation[7] * v.Y + Rotation[8] * v.Z);

    /// <summary>
    /// Every point operation of the lattice: integer matrices M with entries in {-1, 0, 1} that keep the metric
    /// G = A^T A (M^T G M = G). For the built-in (reduced) bases this search is complete (common practice of symmetry
    /// finders); an unreduced explicit basis may miss operations, which only makes the zone sums less reduced, never
    /// wrong. Two-dimensional lattices keep a3 up to sign and the plane. Momentum-free lattices have none.
    /// </summary>
    public static IReadOnlyList<PointOperation> OfLattice(Lattice lattice)
    {
        if (lattice.Dimension == 0) return [];
        Vec3[] a = [lattice.A1, lattice.A2, lattice.A3];
        var g = new double[9];
        for (int i = 0; i < 3; i++) for (int j = 0; j < 3; j++) g[i * 3 + j] = a[i].Dot(a[j]);
        double scale = Math.Max(g[0], Math.Max(g[4], g[8]));
        var inverse = InverseColumns(a);
        var list = new List<PointOperation>();
        Span<int> m = stackalloc int[9];
        for (int code = 0; code < 19683; code++)
        {
            int rest = code;
            for (int i = 0; i < 9; i++) { m[i] = rest % 3 - 1; rest /= 3; }
            if (lattice.Dimension == 2 && (m[2] != 0 || m[5] != 0 || m[6] != 0 || m[7] != 0 || m[8] == 0)) continue;
            var mat = IntMatrix3.FromArray(m);
            int det = mat.Determinant;
            if (det != 1 && det != -1) continue;
            if (!KeepsMetric(mat, g, MetricTolerance * scale)) continue;
            list.Add(new PointOperation(Cartesian(mat, a, inverse), mat));
        }
        // Identity first, then by name, so listings are stable.
        return [.. list.OrderBy(o => o.Name == "1" ? 0 : 1).ThenBy(o => o.Name, StringComparer.Ordinal)];
    }

    /// <summary>Relative tolerance on the metric (lattice vectors are given to about 1e-12 of their length squared).</summary>
    private const double MetricTolerance = 1e-8;

    private static bool KeepsMetric(IntMatrix3 m, double[] g, double tolerance)
    {
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
            {
                double s = 0;
                for (int k = 0; k < 3; k++)
                    for (int l = 0; l < 3; l++) s += m[k, i] * g[k * 3 + l] * m[l, j];
                if (Math.Abs(s - g[i * 3 + j]) > tolerance) return false;
            }
        return true;
    }

    /// <summary>Rows of A^{-1}, where A has the lattice vectors as columns.</summary>
    private static double[] InverseColumns(Vec3[] a)
    {
        double det = a[0].Dot(a[1].Cross(a[2]));
        var r0 = a[1].Cross(a[2]) / det; var r1 = a[2].Cross(a[0]) / det; var r2 = a[0].Cross(a[1]) / det;
        return [r0.X, r0.Y, r0.Z, r1.X, r1.Y, r1.Z, r2.X, r2.Y, r2.Z];
    }

    /// <summary>R = A M A^{-1}.</summary>
    private static double[] Cartesian(IntMatrix3 m, Vec3[] a, double[] inverse)
    {
        var am = new double[9];
        for (int r = 0; r < 3; r++)
            for (int c = 0; c < 3; c++)
                am[r * 3 + c] = a[0][r] * m[0, c] + a[1][r] * m[1, c] + a[2][r] * m[2, c];
        var rot = new double[9];
        for (int r = 0; r < 3; r++)
            for (int c = 0; c < 3; c++)
            {
                double s = am[r * 3] * inverse[c] + am[r * 3 + 1] * inverse[3 + c] + am[r * 3 + 2] * inverse[6 + c];
                rot[r * 3 + c] = Math.Abs(s) < 1e-13 ? 0 : s;
            }
        return rot;
    }

    /// <summary>
    /// Rotation angle and axis of the proper part P = det(R) R (right-hand rule). The angle comes from the integer trace
    /// of the lattice-coordinate matrix (tr R = tr M): 3, 2, 1, 0, -1 give the 1-, 6-, 4-, 3- and 2-fold rotations.
    /// </summary>
    internal static (double Angle, Vec3 Axis) AxisAngle(double[] r, int det, int trace)
    {
        int fold = (det * trace) switch { 3 => 1, 2 => 6, 1 => 4, 0 => 3, -1 => 2, _ => throw new ArgumentException($"trace {trace} is no crystallographic rotation") };
        if (fold == 1) return (0, new Vec3(0, 0, 1));
        var p = new double[9];
        for (int i = 0; i < 9; i++) p[i] = det * r[i];
        double angle = 2 * Math.PI / fold;
        Vec3 axis;
        if (fold == 2)
        {
            // R = 2 n n^T - 1: the largest column of R + 1.
            Vec3[] cols = [new(p[0] + 1, p[3], p[6]), new(p[1], p[4] + 1, p[7]), new(p[2], p[5], p[8] + 1)];
            axis = cols.OrderByDescending(v => v.Norm).First();
            axis /= axis.Norm;
            // A twofold axis has no sense: fix the sign so that the first nonzero component is positive.
            double first = Math.Abs(axis.X) > 1e-9 ? axis.X : Math.Abs(axis.Y) > 1e-9 ? axis.Y : axis.Z;
            if (first < 0) axis = -axis;
        }
        else
        {
            axis = new Vec3(p[7] - p[5], p[2] - p[6], p[3] - p[1]);
            axis /= axis.Norm;
        }
        return (angle, axis);
    }

    /// <summary>Trace of the lattice-coordinate matrix.</summary>
    internal int Trace => LatticeMatrix.M00 + LatticeMatrix.M11 + LatticeMatrix.M22;

    private static string NameOf(double[] r, int det, int trace)
    {
        var (angle, axis) = AxisAngle(r, det, trace);
        int fold = angle == 0 ? 1 : (int)Math.Round(2 * Math.PI / angle);
        if (fold == 1) return det > 0 ? "1" : "-1";
        string dir = Direction(axis);
        if (det < 0 && fold == 2) return $"m{dir}";
        return det > 0 ? $"{fold}{dir}" : $"-{fold}{dir}";
    }

    /// <summary>An axis as the smallest integer Cartesian direction "[1-10]", an in-plane azimuth "[30deg]", or decimals.</summary>
    private static string Direction(Vec3 n)
    {
        double smallest = double.MaxValue;
        foreach (var v in new[] { n.X, n.Y, n.Z }) if (Math.Abs(v) > 1e-9) smallest = Math.Min(smallest, Math.Abs(v));
        for (int mult = 1; mult <= 6; mult++)
        {
            var s = n * (mult / smallest);
            if (Near(s.X) && Near(s.Y) && Near(s.Z) && Math.Max(Math.Abs(s.X), Math.Max(Math.Abs(s.Y), Math.Abs(s.Z))) < 6.5)
                return $"[{Int(s.X)}{Int(s.Y)}{Int(s.Z)}]";
        }
        if (Math.Abs(n.Z) < 1e-9)
            return string.Create(CultureInfo.InvariantCulture, $"[{Math.Round(Math.Atan2(n.Y, n.X) * 180 / Math.PI):0}deg]");
        return string.Create(CultureInfo.InvariantCulture, $"[{n.X:0.###},{n.Y:0.###},{n.Z:0.###}]");

        static bool Near(double v) => Math.Abs(v - Math.Round(v)) < 1e-6;
        static string Int(double v) => ((int)Math.Round(v)).ToString(CultureInfo.InvariantCulture);
    }
}
