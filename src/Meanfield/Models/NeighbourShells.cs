using Meanfield.Lattices;

namespace Meanfield.Models;

/// <summary>
/// Bonds grouped by distance: shell n between two sites is every bond d = R + tau_to - tau_from of the n-th smallest
/// nonzero length. For the built-in lattices this is the point-group orbit of the bond (common practice).
/// </summary>
public static class NeighbourShells
{
    /// <summary>Two lengths closer than this many lattice constants are the same shell.</summary>
    public const double Tolerance = 1e-6;

    /// <summary>
    /// Lattice coordinates R of every bond of shell <paramref name="shell"/> (from 1) from a site at
    /// <paramref name="tauFrom"/> to one at <paramref name="tauTo"/> (angstrom). With <paramref name="oneOfEachPair"/>
    /// (a bond from an orbital to itself) only one of d and -d is kept, since the Hermitian conjugate supplies the other.
    /// Empty when the shell does not exist.
    /// </summary>
    public static IReadOnlyList<(int N1, int N2, int N3)> Bonds(Lattice lattice, Vec3 tauFrom, Vec3 tauTo, int shell, bool oneOfEachPair)
    {
        var candidates = Candidates(lattice, tauFrom, tauTo, shell);
        var lengths = DistinctLengths(candidates, lattice.Constant);
        if (shell < 1 || shell > lengths.Count) return [];
        double target = lengths[shell - 1], tol = Tolerance * lattice.Constant;
        var bonds = new List<(int, int, int)>();
        foreach (var (r, d) in candidates)
        {
            if (Math.Abs(d - target) > tol) continue;
            if (oneOfEachPair && !IsPositive(r)) continue;
            bonds.Add(r);
        }
        return bonds;
    }

    /// <summary>The distinct nonzero bond lengths (angstrom), ascending, up to shell <paramref name="shells"/>.</summary>
    public static IReadOnlyList<double> Distances(Lattice lattice, Vec3 tauFrom, Vec3 tauTo, int shells)
    {
        var lengths = DistinctLengths(Candidates(lattice, tauFrom, tauTo, shells), lattice.Constant);
        return lengths.Take(shells).ToList();
    }

    private static List<((int, int, int) R, double Length)> Candidates(Lattice lattice, Vec3 tauFrom, Vec3 tauTo, int shell)
    {
        // n+2 cells in each direction cover the first n shells of the built-in lattices with room to spare.
        int m = shell + 2, m3 = lattice.Dimension >= 3 ? m : 0;
        var list = new List<((int, int, int), double)>();
        for (int n1 = -m; n1 <= m; n1++)
            for (int n2 = -m; n2 <= m; n2++)
                for (int n3 = -m3; n3 <= m3; n3++)
                {
                    var d = lattice.LatticeVector(n1, n2, n3) + tauTo - tauFrom;
                    list.Add(((n1, n2, n3), d.Norm));
                }
        return list;
    }

    private static List<double> DistinctLengths(List<((int, int, int) R, double Length)> candidates, double a)
    {
        var sorted = candidates.Select(c => c.Length).Where(l => l > Tolerance * a).OrderBy(l => l).ToList();
        var distinct = new List<double>();
        foreach (var l in sorted)
            if (distinct.Count == 0 || l - distinct[^1] > Tolerance * a) distinct.Add(l);
        return distinct;
    }

    /// <summary>True for the member of each +-R pair whose first nonzero coordinate is positive.</summary>
    internal static bool IsPositive((int N1, int N2, int N3) r) =>
        r.N1 > 0 || (r.N1 == 0 && (r.N2 > 0 || (r.N2 == 0 && r.N3 > 0)));
}
