namespace Meanfield.Lattices;

/// <summary>
/// A Bravais lattice: primitive vectors a1, a2, a3 in angstrom and the reciprocal vectors b_i with a_i.b_j = 2 pi delta_ij
/// (inverse angstrom). Two-dimensional lattices have Dimension 2, a3 along z of length Constant, and k_z = 0 everywhere.
/// </summary>
public sealed class Lattice
{
    public LatticeKind Kind { get; }
    /// <summary>Lattice constant a in angstrom (the conventional cube edge for the cubic kinds).</summary>
    public double Constant { get; }
    public int Dimension { get; }
    public Vec3 A1 { get; }
    public Vec3 A2 { get; }
    public Vec3 A3 { get; }
    public Vec3 B1 { get; }
    public Vec3 B2 { get; }
    public Vec3 B3 { get; }
    /// <summary>Volume of the primitive cell in cubic angstrom (area times a for 2D lattices).</summary>
    public double CellVolume { get; }

    public Lattice(LatticeKind kind, double constant, int dimension, Vec3 a1, Vec3 a2, Vec3 a3)
    {
        Kind = kind; Constant = constant; Dimension = dimension;
        A1 = a1; A2 = a2; A3 = a3;
        CellVolume = a1.Dot(a2.Cross(a3));
        if (Math.Abs(CellVolume) < 1e-12 * Math.Pow(Math.Max(a1.Norm, 1e-300), 3))
            throw new ArgumentException("Bravais vectors are linearly dependent.");
        double f = 2 * Math.PI / CellVolume;
        B1 = f * a2.Cross(a3); B2 = f * a3.Cross(a1); B3 = f * a1.Cross(a2);
        CellVolume = Math.Abs(CellVolume);
    }

    /// <summary>The built-in lattice of a kind with lattice constant a (angstrom).</summary>
    public static Lattice Create(LatticeKind kind, double a) => kind switch
    {
        LatticeKind.SimpleCubic => new(kind, a, 3, new(a, 0, 0), new(0, a, 0), new(0, 0, a)),
        LatticeKind.BodyCentredCubic => new(kind, a, 3, new(-a / 2, a / 2, a / 2), new(a / 2, -a / 2, a / 2), new(a / 2, a / 2, -a / 2)),
        LatticeKind.FaceCentredCubic or LatticeKind.Diamond => new(kind, a, 3, new(0, a / 2, a / 2), new(a / 2, 0, a / 2), new(a / 2, a / 2, 0)),
        LatticeKind.Square => new(kind, a, 2, new(a, 0, 0), new(0, a, 0), new(0, 0, a)),
        LatticeKind.Honeycomb => new(kind, a, 2, new(a, 0, 0), new(a / 2, a * Math.Sqrt(3) / 2, 0), new(0, 0, a)),
        LatticeKind.FlatDos or LatticeKind.SemiEllipticDos => new(kind, a, 0, new(a, 0, 0), new(0, a, 0), new(0, 0, a)),
        _ => throw new ArgumentException($"Lattice kind {kind} needs explicit vectors."),
    };

    /// <summary>Default basis positions (angstrom) for kinds that imply one: diamond and honeycomb have two sites.</summary>
    public static IReadOnlyList<Vec3>? DefaultBasis(LatticeKind kind, double a) => kind switch
    {
        LatticeKind.Diamond => [Vec3.Zero, new Vec3(a / 4, a / 4, a / 4)],
        LatticeKind.Honeycomb => [Vec3.Zero, new Vec3(a / 2, a / (2 * Math.Sqrt(3)), 0)],
        _ => null,
    };

    /// <summary>Lattice vector R = n1 a1 + n2 a2 + n3 a3.</summary>
    public Vec3 LatticeVector(int n1, int n2, int n3) => n1 * A1 + n2 * A2 + n3 * A3;

    /// <summary>Cartesian wave vector of reduced coordinates (u1, u2, u3): k = u1 b1 + u2 b2 + u3 b3.</summary>
    public Vec3 Cartesian(double u1, double u2, double u3) => u1 * B1 + u2 * B2 + u3 * B3;

    /// <summary>Reduced coordinates u_i = k.a_i / (2 pi) of a Cartesian wave vector.</summary>
    public Vec3 Reduced(Vec3 k) => new(k.Dot(A1) / (2 * Math.PI), k.Dot(A2) / (2 * Math.PI), k.Dot(A3) / (2 * Math.PI));

    /// <summary>Integer coordinates (n1, n2, n3) of a Cartesian lattice vector, or null when it is not one.</summary>
    public (int, int, int)? LatticeCoordinates(Vec3 r, double tolerance = 1e-6)
    {
        double n1 = r.Dot(B1) / (2 * Math.PI), n2 = r.Dot(B2) / (2 * Math.PI), n3 = r.Dot(B3) / (2 * Math.PI);
        int i1 = (int)Math.Round(n1), i2 = (int)Math.Round(n2), i3 = (int)Math.Round(n3);
        if (Math.Abs(n1 - i1) > tolerance || Math.Abs(n2 - i2) > tolerance || Math.Abs(n3 - i3) > tolerance) return null;
        return (i1, i2, i3);
    }
}
