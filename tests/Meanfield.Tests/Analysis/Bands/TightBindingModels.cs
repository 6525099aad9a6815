using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Tests.Analysis.Bands;

/// <summary>Textbook tight-binding models built directly as <see cref="BoundModel"/> objects for the tests.</summary>
internal static class TightBindingModels
{
    /// <summary>
    /// One orbital per cell, hopping -t to the neighbours at the Cartesian vectors <paramref name="bonds"/> (one of each
    /// +/- pair: the Hermitian conjugate supplies the other), so eps(k) = -t sum over all neighbours of e^{ik.d}.
    /// </summary>
    public static BoundModel SingleBand(Lattice lattice, IEnumerable<Vec3> bonds, double t, int flavours = 1)
    {
        var hops = bonds.Select(d =>
        {
            var r = lattice.LatticeCoordinates(d) ?? throw new ArgumentException($"{d} is not a lattice vector");
            return new Hopping(0, 0, r, FlavourMatrix.Identity(flavours, -t), "test");
        }).ToList();
        return new BoundModel
        {
            Name = $"{lattice.Kind} nearest-neighbour", Lattice = lattice, Flavours = flavours,
            Sites = [new Site("A", Vec3.Zero)], Orbitals = [new Orbital("s", 0, OrbitalKind.Conduction)],
            Shells = [], Hoppings = hops, Onsite = [], ElectronsPerCell = 1, Unit = EnergyUnit.MilliElectronVolt,
        };
    }

    public static BoundModel SimpleCubic(double a, double t) =>
        SingleBand(Lattice.Create(LatticeKind.SimpleCubic, a), [new(a, 0, 0), new(0, a, 0), new(0, 0, a)], t);

    /// <summary>Eight neighbours at (a/2)(+-1, +-1, +-1).</summary>
    public static BoundModel BodyCentred(double a, double t) =>
        SingleBand(Lattice.Create(LatticeKind.BodyCentredCubic, a),
            [new(a / 2, a / 2, a / 2), new(a / 2, a / 2, -a / 2), new(a / 2, -a / 2, a / 2), new(-a / 2, a / 2, a / 2)], t);

    /// <summary>Twelve neighbours at (a/2)(+-1, +-1, 0) and permutations.</summary>
    public static BoundModel FaceCentred(double a, double t) =>
        SingleBand(Lattice.Create(LatticeKind.FaceCentredCubic, a),
            [new(a / 2, a / 2, 0), new(a / 2, -a / 2, 0), new(a / 2, 0, a / 2), new(a / 2, 0, -a / 2), new(0, a / 2, a / 2), new(0, a / 2, -a / 2)], t);

    /// <summary>Diamond lattice, two sites, hopping -t along the four bonds (a/4)(1,1,1), (a/4)(1,-1,-1), (a/4)(-1,1,-1), (a/4)(-1,-1,1).</summary>
    public static BoundModel Diamond(double a, double t)
    {
        var lattice = Lattice.Create(LatticeKind.Diamond, a);
        var basis = Lattice.DefaultBasis(LatticeKind.Diamond, a)!;
        Vec3[] bonds = [new(a / 4, a / 4, a / 4), new(a / 4, -a / 4, -a / 4), new(-a / 4, a / 4, -a / 4), new(-a / 4, -a / 4, a / 4)];
        var hops = bonds.Select(d => new Hopping(0, 1, lattice.LatticeCoordinates(d - (basis[1] - basis[0]))!.Value,
            FlavourMatrix.Identity(1, -t), "test")).ToList();
        return new BoundModel
        {
            Name = "diamond nearest-neighbour", Lattice = lattice, Flavours = 1,
            Sites = [new Site("A", basis[0]), new Site("B", basis[1])],
            Orbitals = [new Orbital("s", 0, OrbitalKind.Conduction), new Orbital("s", 1, OrbitalKind.Conduction)],
            Shells = [], Hoppings = hops, Onsite = [], ElectronsPerCell = 2,
        };
    }

    /// <summary>
    /// Simple-cubic c band (hopping -t) with an on-site hybridization V to a correlated level eps_f on the same site,
    /// spin-1/2 (F = 2), so the basis is (c up, c down, f up, f down).
    /// </summary>
    public static BoundModel HybridizedCubic(double a, double t, double v, double epsF)
    {
        var lattice = Lattice.Create(LatticeKind.SimpleCubic, a);
        var hops = new List<Hopping>
        {
            new(0, 0, (1, 0, 0), FlavourMatrix.Identity(2, -t), "test"),
            new(0, 0, (0, 1, 0), FlavourMatrix.Identity(2, -t), "test"),
            new(0, 0, (0, 0, 1), FlavourMatrix.Identity(2, -t), "test"),
            new(0, 1, (0, 0, 0), FlavourMatrix.Identity(2, new Complex(v, 0)), "test"),
        };
        return new BoundModel
        {
            Name = "hybridized cubic", Lattice = lattice, Flavours = 2,
            Sites = [new Site("A", Vec3.Zero)],
            Orbitals = [new Orbital("c", 0, OrbitalKind.Conduction), new Orbital("f", 0, OrbitalKind.Correlated)],
            Shells = [new CorrelatedShell(1, 2, 1, epsF, "f")], Hoppings = hops, Onsite = [], ElectronsPerCell = 2,
        };
    }
}
