namespace Meanfield.Lattices;

/// <summary>
/// A Monkhorst-Pack mesh of N1 x N2 x N3 points in reduced coordinates u_i in [0, 1).
/// Gamma-centred: u_i = j / N_i. Shifted: u_i = (j + 1/2) / N_i, which avoids the high-symmetry planes.
/// Monkhorst &amp; Pack, Phys. Rev. B 13, 5188 (1976). Every point carries weight 1 / Count.
/// </summary>
public sealed class KMesh
{
    public Lattice Lattice { get; }
    public int N1 { get; }
    public int N2 { get; }
    public int N3 { get; }
    public bool Shifted { get; }
    public int Count => N1 * N2 * N3;

    public KMesh(Lattice lattice, int n, bool shifted = false)
        : this(lattice, n, n, lattice.Dimension >= 3 ? n : 1, shifted) { }

    public KMesh(Lattice lattice, int n1, int n2, int n3, bool shifted = false)
    {
        if (n1 < 1 || n2 < 1 || n3 < 1) throw new ArgumentOutOfRangeException(nameof(n1), "mesh divisions must be positive");
        Lattice = lattice; N1 = n1; N2 = n2; N3 = n3; Shifted = shifted;
    }

    /// <summary>Reduced coordinates of point <paramref name="index"/> (the fastest index runs along b3).</summary>
    public Vec3 Reduced(int index)
    {
        int i3 = index % N3, rest = index / N3, i2 = rest % N2, i1 = rest / N2;
        double s = Shifted ? 0.5 : 0.0;
        double u3 = N3 == 1 && Lattice.Dimension < 3 ? 0.0 : (i3 + s) / N3;
        return new((i1 + s) / N1, (i2 + s) / N2, u3);
    }

    /// <summary>Cartesian wave vector (inverse angstrom) of point <paramref name="index"/>.</summary>
    public Vec3 Cartesian(int index)
    {
        var u = Reduced(index);
        return Lattice.Cartesian(u.X, u.Y, u.Z);
    }

    /// <summary>Index of the mesh point (i1, i2, i3), indices taken modulo the mesh (periodic).</summary>
    public int Index(int i1, int i2, int i3)
    {
        i1 = ((i1 % N1) + N1) % N1; i2 = ((i2 % N2) + N2) % N2; i3 = ((i3 % N3) + N3) % N3;
        return (i1 * N2 + i2) * N3 + i3;
    }

    public override string ToString() => $"{N1}x{N2}x{N3}{(Shifted ? " shifted" : " Gamma-centred")}";
}
