using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Models;

namespace Meanfield.Tests.Models;

/// <summary>
/// Coordination numbers and neighbour distances of the cubic lattices, diamond and honeycomb against the textbook
/// values: sc 6 at a, bcc 8 at sqrt(3)a/2, fcc 12 at a/sqrt(2) (Ashcroft and Mermin, Solid State Physics, 1976,
/// ch. 4, table 4.1 and text); diamond 4 nearest neighbours at sqrt(3)a/4 and 12 next-nearest at a/sqrt(2)
/// (ibid., ch. 4, diamond structure); honeycomb 3 at a/sqrt(3) for triangular constant a (common practice).
/// </summary>
public class NeighbourShellTests
{
    private const double A = 4.0;

    private static string Model(string kind, string sites, string hopping) => $$"""
        [model]
        electrons_per_cell = 1
        [lattice]
        kind = "{{kind}}"
        constant = {{A}}
        {{sites}}
        {{hopping}}
        """;

    private const string OneSite = "[[site]]\nname = \"A\"\nposition = [0, 0, 0]\norbitals = [\"s\"]";
    private const string TwoSites = "[[site]]\nname = \"A\"\norbitals = [\"s\"]\n[[site]]\nname = \"B\"\norbitals = [\"s\"]";

    private static string Hop(string from, string to, int shell) =>
        $"[[hopping]]\nfrom = \"{from}\"\nto = \"{to}\"\nneighbour = {shell}\namplitude = 1";

    /// <summary>All bond vectors including the implied Hermitian conjugates (reverse bonds).</summary>
    private static List<Vec3> AllBonds(BoundModel m)
    {
        var list = new List<Vec3>();
        foreach (var h in m.Hoppings)
        {
            var d = m.Lattice.LatticeVector(h.R.N1, h.R.N2, h.R.N3) + m.Sites[m.Orbitals[h.To].Site].Position - m.Sites[m.Orbitals[h.From].Site].Position;
            list.Add(d);
            if (h.From == h.To) list.Add(-d);
        }
        return list;
    }

    [Theory]
    [InlineData("simple-cubic", 6, 1.0)]
    [InlineData("body-centred-cubic", 8, 0.86602540378443865)]   // sqrt(3)/2
    [InlineData("face-centred-cubic", 12, 0.70710678118654752)]  // 1/sqrt(2)
    public void Cubic_nearest_neighbours(string kind, int z, double distanceOverA)
    {
        var m = ModelText.Bind(Model(kind, OneSite, Hop("A:s", "A:s", 1)));
        Assert.Equal(z / 2, m.Hoppings.Count); // one of each +-d pair stored, the other is the h.c.
        var bonds = AllBonds(m);
        Assert.Equal(z, bonds.Count);
        Assert.All(bonds, d => Assert.Equal(distanceOverA * A, d.Norm, 10));
        Assert.Equal(z, bonds.Select(d => (Math.Round(d.X, 6), Math.Round(d.Y, 6), Math.Round(d.Z, 6))).Distinct().Count());
    }

    [Fact]
    public void Simple_cubic_second_shell_is_twelve_at_sqrt2_a()
    {
        // Second neighbours of sc: the 12 face diagonals a(+-1,+-1,0) (Ashcroft and Mermin, ch. 4).
        var m = ModelText.Bind(Model("simple-cubic", OneSite, Hop("A:s", "A:s", 2)));
        var bonds = AllBonds(m);
        Assert.Equal(12, bonds.Count);
        Assert.All(bonds, d => Assert.Equal(Math.Sqrt(2) * A, d.Norm, 10));
    }

    [Fact]
    public void Diamond_nearest_neighbours_are_four_at_sqrt3_a_over_4()
    {
        var m = ModelText.Bind(Model("diamond", TwoSites, Hop("A:s", "B:s", 1)));
        Assert.Equal(4, m.Hoppings.Count); // A->B is not its own reverse: all four are stored
        var bonds = AllBonds(m);
        Assert.All(bonds, d => Assert.Equal(Math.Sqrt(3) / 4 * A, d.Norm, 10));
        // The four bonds are (a/4)(1,1,1), (a/4)(1,-1,-1), (a/4)(-1,1,-1), (a/4)(-1,-1,1) and sum to zero.
        var sum = bonds.Aggregate(Vec3.Zero, (s, d) => s + d);
        Assert.True(sum.Norm < 1e-12);
        Assert.All(bonds, d => Assert.Equal(A / 4, Math.Abs(d.X), 10));
    }

    [Fact]
    public void Diamond_next_nearest_neighbours_are_twelve_at_a_over_sqrt2()
    {
        // Shells count distances between the two sites named: from A to A the first shell is the next-nearest one.
        var m = ModelText.Bind(Model("diamond", TwoSites, Hop("A:s", "A:s", 1)));
        var bonds = AllBonds(m);
        Assert.Equal(12, bonds.Count);
        Assert.All(bonds, d => Assert.Equal(A / Math.Sqrt(2), d.Norm, 10));
    }

    [Fact]
    public void Diamond_same_sublattice_first_shell_is_the_next_nearest_distance()
    {
        // From A to A the first nonzero distance is the fcc one, a/sqrt(2); from A to B it is sqrt(3)a/4.
        var lattice = Lattice.Create(LatticeKind.Diamond, A);
        var basis = Lattice.DefaultBasis(LatticeKind.Diamond, A)!;
        Assert.Equal(A / Math.Sqrt(2), NeighbourShells.Distances(lattice, basis[0], basis[0], 1)[0], 10);
        Assert.Equal(Math.Sqrt(3) / 4 * A, NeighbourShells.Distances(lattice, basis[0], basis[1], 1)[0], 10);
    }

    [Fact]
    public void Honeycomb_nearest_neighbours_are_three_at_a_over_sqrt3()
    {
        var m = ModelText.Bind(Model("honeycomb", TwoSites, Hop("A:s", "B:s", 1)));
        var bonds = AllBonds(m);
        Assert.Equal(3, bonds.Count);
        Assert.All(bonds, d => Assert.Equal(A / Math.Sqrt(3), d.Norm, 10));
        Assert.All(bonds, d => Assert.Equal(0, d.Z, 12));
    }

    [Fact]
    public void Different_orbitals_on_one_site_keep_both_directions()
    {
        // c^dag_s c_p(R) and c^dag_s c_p(-R) are different operators: no halving between different orbitals.
        string site = "[[site]]\nname = \"A\"\nposition = [0, 0, 0]\norbitals = [\"s\", \"p\"]";
        var m = ModelText.Bind(Model("simple-cubic", site, Hop("A:s", "A:p", 1)));
        Assert.Equal(6, m.Hoppings.Count);
    }
}
