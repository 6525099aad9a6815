using System.Numerics;

namespace Meanfield.Symmetry;

/// <summary>
/// A symmetry of a Bloch Hamiltonian: a point operation R of the lattice, optionally combined with time reversal, and the
/// basis transformation U (site permutation times a flavour rotation) with (the Bloch phase including the site positions)
///   unitary:      H(R k)  = U H(k)  U^dag
///   antiunitary:  H(-R k) = U H(k)^* U^dag    (time reversal: psi -> U psi^*)
/// so E_n(S k) = E_n(k) with S = +-R, and every f weight and dE/dr of a shell group the operation keeps is the same at
/// S k as at k (both are traces over the group's f components, even under time reversal).
/// </summary>
public sealed class SymmetryOperation
{
    /// <summary>The lattice operation (Cartesian rotation, lattice-coordinate matrix).</summary>
    public PointOperation Point { get; }
    /// <summary>True for an antiunitary operation (combined with time reversal).</summary>
    public bool TimeReversal { get; }
    /// <summary>U, row-major Size x Size.</summary>
    public Complex[] Unitary { get; }
    /// <summary>The action on reduced wave-vector coordinates: u' = K u with K = +-(M^{-1})^T (minus with time reversal).</summary>
    public IntMatrix3 ReciprocalMatrix { get; }
    /// <summary>Hermann-Mauguin style name with the axis; a prime marks time reversal ("2'[100]", "1'" is time reversal alone).</summary>
    public string Name { get; }

    internal SymmetryOperation(PointOperation point, bool timeReversal, Complex[] unitary)
    {
        Point = point; TimeReversal = timeReversal; Unitary = unitary;
        var k = InverseTranspose(point.LatticeMatrix);
        ReciprocalMatrix = timeReversal ? -k : k;
        Name = timeReversal ? Prime(point.Name) : point.Name;
    }

    /// <summary>Lattice-coordinate matrices are unimodular: (M^{-1})^T is the transposed adjugate times det M.</summary>
    private static IntMatrix3 InverseTranspose(IntMatrix3 m)
    {
        int det = m.Determinant;
        Span<int> c = stackalloc int[9];
        for (int r = 0; r < 3; r++)
            for (int col = 0; col < 3; col++)
            {
                int r1 = (r + 1) % 3, r2 = (r + 2) % 3, c1 = (col + 1) % 3, c2 = (col + 2) % 3;
                c[r * 3 + col] = det * (m[r1, c1] * m[r2, c2] - m[r1, c2] * m[r2, c1]); // cofactor (r, col)
            }
        return IntMatrix3.FromArray(c);
    }

    private static string Prime(string name)
    {
        int bracket = name.IndexOf('[');
        return bracket < 0 ? name + "'" : name[..bracket] + "'" + name[bracket..];
    }

    public override string ToString() => Name;
}
