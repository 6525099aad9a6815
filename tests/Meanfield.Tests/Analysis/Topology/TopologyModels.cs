using System.Numerics;
using Meanfield.Analysis.Symmetry;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>Textbook models for the invariant and response tests, built in code (parameters are invented numbers).</summary>
internal static class TopologyModels
{
    /// <summary>
    /// Haldane's honeycomb model (Haldane, PRL 61, 2015 (1988)), spinless: nearest-neighbour hopping t1, next-nearest
    /// t2 e^{+i phi} on A and t2 e^{-i phi} on B along the three vectors a1, a2 - a1, -a2 (120 degrees apart), and a
    /// sublattice potential +M on A, -M on B. Sites at (0, 0) and (a/2, a/(2 sqrt 3)).
    /// </summary>
    public static BlochHamiltonian Haldane(double t1, double t2, double phi, double m, double a = 2.5)
    {
        var lat = Lattice.Create(LatticeKind.Honeycomb, a);
        var tauB = new Vec3(a / 2, a / (2 * Math.Sqrt(3)), 0);
        var nn = FlavourMatrix.Identity(1, t1);
        var hops = new List<Hopping>
        {
            new(0, 1, (0, 0, 0), nn, "nn1"), new(0, 1, (-1, 0, 0), nn, "nn2"), new(0, 1, (0, -1, 0), nn, "nn3"),
        };
        (int, int, int)[] nnn = [(1, 0, 0), (-1, 1, 0), (0, -1, 0)];
        var pa = FlavourMatrix.Identity(1, t2 * Complex.FromPolarCoordinates(1, phi));
        var pb = FlavourMatrix.Identity(1, t2 * Complex.FromPolarCoordinates(1, -phi));
        foreach (var r in nnn) { hops.Add(new(0, 0, r, pa, "nnnA")); hops.Add(new(1, 1, r, pb, "nnnB")); }
        return new(new BoundModel
        {
            Name = "haldane", Lattice = lat, Flavours = 1, Sites = [new("A", Vec3.Zero), new("B", tauB)],
            Orbitals = [new("p", 0, OrbitalKind.Conduction), new("p", 1, OrbitalKind.Conduction)], Shells = [],
            Hoppings = hops, Onsite = [new(0, FlavourMatrix.Identity(1, m), "MA"), new(1, FlavourMatrix.Identity(1, -m), "MB")],
            ElectronsPerCell = 1,
        });
    }

    /// <summary>
    /// The Kane-Mele model without Rashba coupling (Kane &amp; Mele, PRL 95, 146802 (2005)): spin-1/2 on the honeycomb
    /// net, nearest-neighbour hopping t, intrinsic spin-orbit i lambda nu_ij s_z on next-nearest bonds (nu = +1 along
    /// a1, a2 - a1, -a2 on A, -1 on B) and a sublattice potential +-M. Quantum spin Hall for |M| &lt; 3 sqrt(3) lambda.
    /// </summary>
    public static BlochHamiltonian KaneMele(double t, double lambda, double m, double a = 2.5)
    {
        var lat = Lattice.Create(LatticeKind.Honeycomb, a);
        var tauB = new Vec3(a / 2, a / (2 * Math.Sqrt(3)), 0);
        var nn = FlavourMatrix.Identity(2, t);
        var hops = new List<Hopping>
        {
            new(0, 1, (0, 0, 0), nn, "nn1"), new(0, 1, (-1, 0, 0), nn, "nn2"), new(0, 1, (0, -1, 0), nn, "nn3"),
        };
        (int, int, int)[] nnn = [(1, 0, 0), (-1, 1, 0), (0, -1, 0)];
        var so = FlavourMatrix.Pauli(0, 0, 0, Complex.ImaginaryOne * lambda);
        foreach (var r in nnn) { hops.Add(new(0, 0, r, so, "soA")); hops.Add(new(1, 1, r, so.Scale(-1), "soB")); }
        return new(new BoundModel
        {
            Name = "kane-mele", Lattice = lat, Flavours = 2, Sites = [new("A", Vec3.Zero), new("B", tauB)],
            Orbitals = [new("p", 0, OrbitalKind.Conduction), new("p", 1, OrbitalKind.Conduction)], Shells = [],
            Hoppings = hops, Onsite = [new(0, FlavourMatrix.Identity(2, m), "MA"), new(1, FlavourMatrix.Identity(2, -m), "MB")],
            ElectronsPerCell = 2,
        });
    }

    /// <summary>
    /// The massive 2D Dirac cone H = v (k_x sigma_x + k_y sigma_y) + m sigma_z (not periodic), on the model of a square
    /// lattice so that it can be handed to the response code; its velocities come from finite differences.
    /// </summary>
    public sealed class MassiveDirac(double velocity, double mass) : IBlochSource
    {
        public BoundModel Model { get; } = new()
        {
            Name = "dirac", Lattice = Lattice.Create(LatticeKind.Square, 1), Flavours = 2, Sites = [new("A", Vec3.Zero)],
            Orbitals = [new("d", 0, OrbitalKind.Conduction)], Shells = [], Hoppings = [], Onsite = [], ElectronsPerCell = 1,
        };
        public int Size => 2;
        public void Assemble(Vec3 k, Span<Complex> h, Span<Complex> scratch)
        {
            h[0] = mass; h[1] = new Complex(velocity * k.X, -velocity * k.Y);
            h[2] = new Complex(velocity * k.X, velocity * k.Y); h[3] = -mass;
        }
    }

    /// <summary>
    /// The mirror image of a model: every Bravais vector and site position reflected by M = 1 - 2 n n^T, and every
    /// flavour matrix conjugated by the spin image of the proper rotation -M (a two-fold rotation about n), since spin is
    /// axial. Bond lattice coordinates are unchanged because the Bravais vectors are reflected with the sites.
    /// </summary>
    public static BlochHamiltonian MirrorImage(BoundModel model, Vec3 normal)
    {
        var n = normal / normal.Norm;
        double[] m = [1 - 2 * n.X * n.X, -2 * n.X * n.Y, -2 * n.X * n.Z, -2 * n.Y * n.X, 1 - 2 * n.Y * n.Y, -2 * n.Y * n.Z,
                      -2 * n.Z * n.X, -2 * n.Z * n.Y, 1 - 2 * n.Z * n.Z];
        var op = new SpaceOperation(m, Vec3.Zero, [], [], []);
        var s = ModelSymmetry.SpinMatrix(m, -1, model.Flavours);
        int f = model.Flavours;
        FlavourMatrix Spin(FlavourMatrix a)
        {
            var r = new Complex[f * f];
            for (int i = 0; i < f; i++)
                for (int j = 0; j < f; j++)
                    for (int c = 0; c < f; c++)
                        for (int d = 0; d < f; d++)
                            r[i * f + j] += s[i * f + c] * a[c, d] * Complex.Conjugate(s[j * f + d]);
            return new FlavourMatrix(f, r);
        }
        var l = model.Lattice;
        var lattice = new Lattice(LatticeKind.Explicit, l.Constant, l.Dimension, op.Apply(l.A1), op.Apply(l.A2), op.Apply(l.A3));
        return new(new BoundModel
        {
            Name = model.Name + " (mirror)", Lattice = lattice, Flavours = f,
            Sites = model.Sites.Select(x => x with { Position = op.Apply(x.Position) }).ToArray(),
            Orbitals = model.Orbitals, Shells = model.Shells,
            Hoppings = model.Hoppings.Select(h => h with { Amplitude = Spin(h.Amplitude) }).ToArray(),
            Onsite = model.Onsite.Select(o => o with { Amplitude = Spin(o.Amplitude) }).ToArray(),
            ElectronsPerCell = model.ElectronsPerCell,
        });
    }
}
