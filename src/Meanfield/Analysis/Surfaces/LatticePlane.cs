using System.Globalization;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// A family of lattice planes of a 3D Bravais lattice and the vectors that describe a crystal cut along it: the shortest
/// reciprocal lattice vector G normal to the planes, the plane spacing d = 2 pi / |G|, two in-plane lattice vectors
/// (a reduced basis of the 2D lattice in one plane, with A1 x A2 along +G) and a stacking vector A3 that steps one plane
/// up (G.A3 = 2 pi). The outward normal of the "top" surface is +G: the crystal lies below.
/// Indices of the cubic kinds are Miller indices of the conventional cube, G parallel to (h, k, l) in Cartesian
/// axes; for explicit lattices they are reduced indices along the primitive reciprocal vectors, G parallel to
/// h b1 + k b2 + l b3 (common practice; Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 5).
/// </summary>
public sealed class LatticePlane
{
    /// <summary>Largest |index| accepted: larger indices give slabs of impractical width.</summary>
    public const int MaxIndex = 12;

    /// <summary>The indices as given (conventional Miller indices or reduced indices).</summary>
    public (int H, int K, int L) Indices { get; }
    /// <summary>True when <see cref="Indices"/> refer to the conventional cubic cell.</summary>
    public bool Conventional { get; }
    /// <summary>G in units of the primitive reciprocal vectors: coprime integers (g1, g2, g3).</summary>
    public (int G1, int G2, int G3) Reciprocal { get; }
    /// <summary>Outward unit normal of the top surface (along G).</summary>
    public Vec3 Normal { get; }
    /// <summary>Spacing of neighbouring lattice planes, angstrom.</summary>
    public double Spacing { get; }
    /// <summary>In-plane lattice vectors (angstrom): a reduced basis with A1.A2 &lt;= 0 and (A1 x A2).G &gt; 0.</summary>
    public Vec3 A1 { get; }
    public Vec3 A2 { get; }
    /// <summary>Stacking vector (angstrom): a lattice vector from one plane to the next one up (G.A3 = 2 pi).</summary>
    public Vec3 A3 { get; }
    /// <summary>Integer lattice coordinates of A1, A2, A3 along the primitive vectors a1, a2, a3.</summary>
    public (int, int, int) N1 { get; }
    public (int, int, int) N2 { get; }
    public (int, int, int) N3 { get; }
    public Lattice Lattice { get; }

    private LatticePlane(Lattice lattice, (int, int, int) indices, bool conventional, (int, int, int) g,
                         (int, int, int) n1, (int, int, int) n2, (int, int, int) n3)
    {
        Lattice = lattice; Indices = indices; Conventional = conventional; Reciprocal = g;
        var gv = lattice.Cartesian(g.Item1, g.Item2, g.Item3);
        Normal = gv / gv.Norm; Spacing = 2 * Math.PI / gv.Norm;
        N1 = n1; N2 = n2; N3 = n3;
        A1 = lattice.LatticeVector(n1.Item1, n1.Item2, n1.Item3);
        A2 = lattice.LatticeVector(n2.Item1, n2.Item2, n2.Item3);
        A3 = lattice.LatticeVector(n3.Item1, n3.Item2, n3.Item3);
    }

    /// <summary>Reads "h,k,l" (commas or spaces; a leading '-' per index, e.g. "1,-1,0").</summary>
    /// <exception cref="RequestError">Not three integers, all zero, larger than <see cref="MaxIndex"/>, or a lattice
    /// that is not three-dimensional.</exception>
    public static LatticePlane Parse(string text, Lattice lattice)
    {
        var parts = text.Split([',', ' ', '\t'], StringSplitOptions.RemoveEmptyEntries);
        if (parts.Length != 3)
            throw new RequestError($"--plane '{text}': give three integers h,k,l, for example 0,0,1 or 1,-1,0");
        var v = new int[3];
        for (int i = 0; i < 3; i++)
            if (!int.TryParse(parts[i], NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out v[i]))
                throw new RequestError($"--plane '{text}': '{parts[i]}' is not an integer");
        return FromIndices(lattice, v[0], v[1], v[2]);
    }

    /// <summary>The plane family (h k l); see the class summary for which cell the indices refer to.</summary>
    /// <exception cref="RequestError">All indices zero (no plane), an index beyond <see cref="MaxIndex"/>, or a
    /// lattice that is not three-dimensional.</exception>
    public static LatticePlane FromIndices(Lattice lattice, int h, int k, int l)
    {
        if (lattice.Dimension != 3)
            throw new RequestError(lattice.Kind.IsMomentumFree()
                ? $"a momentum-free lattice ({lattice.Kind}) has no surfaces"
                : $"a two-dimensional lattice ({lattice.Kind}) has no surface planes: surfaces need a 3D model");
        if (h == 0 && k == 0 && l == 0) throw new RequestError("--plane 0,0,0: surface indices (0,0,0) do not define a lattice plane");
        if (Math.Max(Math.Abs(h), Math.Max(Math.Abs(k), Math.Abs(l))) > MaxIndex)
            throw new RequestError($"--plane {h},{k},{l}: indices above {MaxIndex} give impractically wide slabs");
        bool conventional = lattice.Kind is LatticeKind.SimpleCubic or LatticeKind.BodyCentredCubic
            or LatticeKind.FaceCentredCubic or LatticeKind.Diamond;
        (int, int, int) g;
        if (conventional)
        {
            // G along (h, k, l) (2 pi / a): its primitive coordinates are g_i = (h, k, l).a_i / a, halves at most.
            double a = lattice.Constant;
            var dir = new Vec3(h, k, l);
            int[] twice = [(int)Math.Round(2 * dir.Dot(lattice.A1) / a), (int)Math.Round(2 * dir.Dot(lattice.A2) / a), (int)Math.Round(2 * dir.Dot(lattice.A3) / a)];
            g = Primitive(twice[0], twice[1], twice[2]);
        }
        else g = Primitive(h, k, l);
        var (n1, n2, n3) = Basis(lattice, g);
        return new LatticePlane(lattice, (h, k, l), conventional, g, n1, n2, n3);
    }

    private static (int, int, int) Primitive(int a, int b, int c)
    {
        int d = Gcd(Gcd(Math.Abs(a), Math.Abs(b)), Math.Abs(c));
        return (a / d, b / d, c / d);
    }

    private static int Gcd(int a, int b) { while (b != 0) (a, b) = (b, a % b); return a; }

    // In-plane basis (g.n = 0, n1 x n2 = +-g so that they span the whole 2D sublattice) and a stacking vector (g.n = 1),
    // by enumeration over a box that always contains a reduced basis for these index sizes.
    private static ((int, int, int), (int, int, int), (int, int, int)) Basis(Lattice lattice, (int, int, int) g)
    {
        int box = 2 * Math.Max(Math.Abs(g.Item1), Math.Max(Math.Abs(g.Item2), Math.Abs(g.Item3))) + 1;
        var inPlane = new List<((int, int, int) N, double Length)>();
        var stack = new List<((int, int, int) N, double Length)>();
        for (int i = -box; i <= box; i++)
            for (int j = -box; j <= box; j++)
                for (int m = -box; m <= box; m++)
                {
                    if (i == 0 && j == 0 && m == 0) continue;
                    int dot = g.Item1 * i + g.Item2 * j + g.Item3 * m;
                    double len = lattice.LatticeVector(i, j, m).Norm;
                    if (dot == 0) inPlane.Add(((i, j, m), len));
                    else if (dot == 1) stack.Add(((i, j, m), len));
                }
        inPlane.Sort((x, y) => x.Length.CompareTo(y.Length));
        stack.Sort((x, y) => x.Length.CompareTo(y.Length));
        var n1 = inPlane[0].N;
        (int, int, int)? n2 = null;
        foreach (var (n, _) in inPlane)
        {
            var c = Cross(n1, n);
            if (c == g || c == (-g.Item1, -g.Item2, -g.Item3)) { n2 = n; break; }
        }
        if (n2 is null) throw new InvalidOperationException($"no in-plane basis found for G = {g}");
        var b = n2.Value;
        Vec3 V((int, int, int) n) => lattice.LatticeVector(n.Item1, n.Item2, n.Item3);
        var gv = lattice.Cartesian(g.Item1, g.Item2, g.Item3);
        if (V(n1).Cross(V(b)).Dot(gv) < 0) b = (-b.Item1, -b.Item2, -b.Item3);
        // Obtuse in-plane angle: a hexagonal plane then has reciprocal vectors at 60 degrees.
        if (V(n1).Dot(V(b)) > 1e-9 * V(n1).Dot(V(n1))) b = (b.Item1 - n1.Item1, b.Item2 - n1.Item2, b.Item3 - n1.Item3);
        return (n1, b, stack[0].N);
    }

    private static (int, int, int) Cross((int, int, int) a, (int, int, int) b) =>
        (a.Item2 * b.Item3 - a.Item3 * b.Item2, a.Item3 * b.Item1 - a.Item1 * b.Item3, a.Item1 * b.Item2 - a.Item2 * b.Item1);

    /// <summary>Height of a position above the plane through the origin, in plane spacings (G.r / 2 pi).</summary>
    public double Height(Vec3 r) => r.Dot(Normal) / Spacing;

    /// <summary>"(0 0 1)" as written, with "conventional" or "reduced".</summary>
    public override string ToString() =>
        $"({Indices.H} {Indices.K} {Indices.L}) {(Conventional ? "conventional-cell Miller indices" : "reduced indices")}";
}
