using Meanfield.Lattices;

namespace Meanfield.Models;

/// <summary>
/// Geometry of the Fu-Kane-Mele spin-orbit term on the diamond lattice,
/// H_SO = i (8 lambda / a^2) sum_{ordered next-nearest pairs i,j} c^dag_i s.(d1 x d2) c_j
/// (Fu, Kane and Mele, PRL 98, 106803 (2007), eq. 1), where d1 and d2 are the two nearest-neighbour bonds from i to j.
/// </summary>
/// <remarks>
/// A bound model implies the Hermitian conjugate of each bond, and the reverse pair (j, i) is exactly that conjugate
/// (d1 x d2 changes sign), so each unordered pair is generated once; this reproduces the ordered-pair sum. Writing
/// the sum over unordered bonds instead would halve lambda: the factor-2 trap.
/// </remarks>
public static class FuKaneMeleTerm
{
    /// <summary>One next-nearest bond from a site to itself in cell R with coefficient vector v = (8/a^2) d1 x d2.</summary>
    public readonly record struct Bond((int N1, int N2, int N3) R, Vec3 V);

    /// <summary>
    /// The next-nearest-neighbour bonds of site <paramref name="site"/> (one of each +-d pair) with their vectors v,
    /// so that the bond amplitude is i lambda v.sigma. Null when some pair has no unique nearest-neighbour path.
    /// </summary>
    public static IReadOnlyList<Bond>? Bonds(Lattice lattice, IReadOnlyList<Vec3> positions, int site)
    {
        var tau = positions[site];
        double nn = double.MaxValue;
        var nearest = new List<Vec3>();
        for (int m = 0; m < positions.Count; m++)
            if (m != site)
            {
                var d = NeighbourShells.Distances(lattice, tau, positions[m], 1);
                if (d.Count > 0) nn = Math.Min(nn, d[0]);
            }
        if (nn == double.MaxValue) return null;
        double tol = NeighbourShells.Tolerance * lattice.Constant;
        for (int m = 0; m < positions.Count; m++)
            if (m != site)
                foreach (var r in NeighbourShells.Bonds(lattice, tau, positions[m], 1, false))
                {
                    var d1 = lattice.LatticeVector(r.N1, r.N2, r.N3) + positions[m] - tau;
                    if (Math.Abs(d1.Norm - nn) < tol) nearest.Add(d1);
                }
        double scale = 8 / (lattice.Constant * lattice.Constant);
        var bonds = new List<Bond>();
        foreach (var r in NeighbourShells.Bonds(lattice, tau, tau, 1, oneOfEachPair: true))
        {
            var d = lattice.LatticeVector(r.N1, r.N2, r.N3);
            Vec3? v = null;
            int paths = 0;
            foreach (var d1 in nearest)
            {
                var d2 = d - d1;
                if (Math.Abs(d2.Norm - nn) < tol) { paths++; v = scale * d1.Cross(d2); }
            }
            if (paths != 1) return null;
            bonds.Add(new Bond(r, v!.Value));
        }
        return bonds;
    }
}
