using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Tests.Support;

/// <summary>Models built in code for tests, independent of the model-file parser.</summary>
internal static class TestModels
{
    /// <summary>
    /// One conduction orbital and one N-fold shell per cell with on-site hybridization V, on a momentum-free lattice
    /// (flat or semi-elliptic DOS of half-width D), or on a simple-cubic lattice with nearest-neighbour hopping -t.
    /// </summary>
    public static BoundModel LocalHybridization(LatticeKind kind, double halfWidthOrHopping, double v, double ef,
                                                int n, double electrons, double q = 1.0)
    {
        var lattice = Lattice.Create(kind, 4.0);
        var orbitals = new List<Orbital> { new("c", 0, OrbitalKind.Conduction), new("f", 0, OrbitalKind.Correlated) };
        var hoppings = new List<Hopping> { new(0, 1, (0, 0, 0), FlavourMatrix.Identity(n, v), "hybridization") };
        if (!kind.IsMomentumFree())
        {
            var t = FlavourMatrix.Identity(n, -halfWidthOrHopping);
            hoppings.Add(new(0, 0, (1, 0, 0), t, "t1"));
            hoppings.Add(new(0, 0, (0, 1, 0), t, "t2"));
            hoppings.Add(new(0, 0, (0, 0, 1), t, "t3"));
        }
        return new BoundModel
        {
            Name = "test", Lattice = lattice, Flavours = n, Sites = [new Site("A", Vec3.Zero)], Orbitals = orbitals,
            Shells = [new CorrelatedShell(1, n, q, ef, "A")], Hoppings = hoppings, Onsite = [],
            ElectronsPerCell = electrons, DosHalfWidth = kind.IsMomentumFree() ? halfWidthOrHopping : 0,
        };
    }

    /// <summary>
    /// Two sites A and B on a simple-cubic lattice of cells (A at 0, B at a/2 along x), each with a conduction orbital and
    /// a shell, alternating hopping A-B, on-site hybridization, and a staggered potential +m on A, -m on B.
    /// </summary>
    public static BoundModel TwoSublattice(double t, double v, double ef, double staggered, double electrons)
    {
        var lattice = Lattice.Create(LatticeKind.SimpleCubic, 4.0);
        var sites = new List<Site> { new("A", Vec3.Zero), new("B", new Vec3(2.0, 0, 0)) };
        var orbitals = new List<Orbital>
        {
            new("c", 0, OrbitalKind.Conduction), new("f", 0, OrbitalKind.Correlated),
            new("c", 1, OrbitalKind.Conduction), new("f", 1, OrbitalKind.Correlated),
        };
        var hop = FlavourMatrix.Identity(2, -t);
        var hoppings = new List<Hopping>
        {
            new(0, 2, (0, 0, 0), hop, "AB"), new(0, 2, (-1, 0, 0), hop, "AB'"),
            new(0, 0, (0, 1, 0), hop, "Ay"), new(0, 0, (0, 0, 1), hop, "Az"),
            new(2, 2, (0, 1, 0), hop, "By"), new(2, 2, (0, 0, 1), hop, "Bz"),
            new(0, 1, (0, 0, 0), FlavourMatrix.Identity(2, v), "VA"), new(2, 3, (0, 0, 0), FlavourMatrix.Identity(2, v), "VB"),
        };
        var onsite = new List<OnsiteTerm>
        {
            new(0, FlavourMatrix.Identity(2, staggered), "mA"), new(2, FlavourMatrix.Identity(2, -staggered), "mB"),
        };
        return new BoundModel
        {
            Name = "two-sublattice", Lattice = lattice, Flavours = 2, Sites = sites, Orbitals = orbitals,
            Shells = [new CorrelatedShell(1, 2, 1, ef, "A"), new CorrelatedShell(3, 2, 1, ef, "B")],
            Hoppings = hoppings, Onsite = onsite, ElectronsPerCell = electrons,
        };
    }
}
