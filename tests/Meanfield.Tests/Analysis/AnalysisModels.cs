using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis;

/// <summary>Small textbook lattice models built by hand for the analysis tests (parameters are invented numbers).</summary>
internal static class AnalysisModels
{
    private static readonly Complex I = Complex.ImaginaryOne;

    private static BoundModel Model(string name, Lattice lattice, int flavours, Site[] sites, Orbital[] orbitals,
                                    Hopping[] hoppings, OnsiteTerm[] onsite, double electrons, CorrelatedShell[]? shells = null) => new()
    {
        Name = name, Lattice = lattice, Flavours = flavours, Sites = sites, Orbitals = orbitals,
        Shells = shells ?? [], Hoppings = hoppings, Onsite = onsite, ElectronsPerCell = electrons,
    };

    /// <summary>Simple-cubic nearest-neighbour band eps(k) = -2t (cos kx a + cos ky a + cos kz a), spinless.</summary>
    public static BlochHamiltonian SimpleCubic(double t, double a = 1.0)
    {
        var amp = FlavourMatrix.Identity(1, -t);
        return new(Model("sc", Lattice.Create(LatticeKind.SimpleCubic, a), 1, [new("A", Vec3.Zero)],
            [new("s", 0, OrbitalKind.Conduction)],
            [new(0, 0, (1, 0, 0), amp, "x"), new(0, 0, (0, 1, 0), amp, "y"), new(0, 0, (0, 0, 1), amp, "z")], [], 0.5));
    }

    /// <summary>Square-lattice band eps(k) = -2t (cos kx a + cos ky a), spinless (2D, linear triangle method).</summary>
    public static BlochHamiltonian Square(double t, double a = 1.0)
    {
        var amp = FlavourMatrix.Identity(1, -t);
        return new(Model("square", Lattice.Create(LatticeKind.Square, a), 1, [new("A", Vec3.Zero)],
            [new("s", 0, OrbitalKind.Conduction)], [new(0, 0, (1, 0, 0), amp, "x"), new(0, 0, (0, 1, 0), amp, "y")], [], 0.5));
    }

    /// <summary>
    /// Two-band lattice Weyl model H = t [s sin(kx a) sx + sin(ky a) sy + (cos kz a - cos k0 a + 2 - cos kx a - cos ky a) sz]
    /// on a simple-cubic lattice (flavours = 2 carry the Pauli structure), s = +1 or -1 (mirror image kx -> -kx).
    /// Weyl nodes at (0, 0, +-k0).
    /// </summary>
    public static BlochHamiltonian LatticeWeyl(double t, double k0a, double a, int mirror = 1)
    {
        // A e^{ik.R} + h.c. with A = -i (t/2) sigma gives t sin(k.R) sigma; A = c sigma_z gives 2 c cos(k.R) sigma_z.
        var ax = FlavourMatrix.Pauli(0, -I * mirror * t / 2, 0, -t / 2);
        var ay = FlavourMatrix.Pauli(0, 0, -I * t / 2, -t / 2);
        var az = FlavourMatrix.Pauli(0, 0, 0, t / 2);
        var mass = FlavourMatrix.Pauli(0, 0, 0, t * (2 - Math.Cos(k0a)));
        return new(Model("weyl", Lattice.Create(LatticeKind.SimpleCubic, a), 2, [new("A", Vec3.Zero)],
            [new("d", 0, OrbitalKind.Conduction)],
            [new(0, 0, (1, 0, 0), ax, "x"), new(0, 0, (0, 1, 0), ay, "y"), new(0, 0, (0, 0, 1), az, "z")],
            [new(0, mass, "mass")], 1));
    }

    /// <summary>
    /// Fu-Kane-Mele diamond model: s orbital on sites A (0) and B ((a/4)(1,1,1)), spin-1/2; nearest-neighbour hopping t
    /// (t + dt on the [111] bond), next-nearest spin-orbit i (8 lambda / a^2) s.(d1 x d2) with each unordered pair once
    /// (h.c. implied), and a staggered potential +m on A, -m on B.
    /// Fu, Kane &amp; Mele, PRL 98, 106803 (2007); Murakami, New J. Phys. 9, 356 (2007).
    /// </summary>
    public static BlochHamiltonian FuKaneMele(double t, double lambda, double dt = 0, double m = 0, double a = 1.0)
    {
        var lat = Lattice.Create(LatticeKind.Diamond, a);
        Vec3[] d = [new(a / 4, a / 4, a / 4), new(a / 4, -a / 4, -a / 4), new(-a / 4, a / 4, -a / 4), new(-a / 4, -a / 4, a / 4)];
        var tauB = d[0];
        var hops = new List<Hopping>();
        for (int i = 0; i < 4; i++)
        {
            var R = lat.LatticeCoordinates(d[i] - tauB)!.Value;
            hops.Add(new(0, 1, R, FlavourMatrix.Identity(2, i == 0 ? t + dt : t), $"nn{i}"));
        }
        double pref = 8 * lambda / (a * a);
        for (int p = 0; p < 4; p++)
            for (int q = p + 1; q < 4; q++)
            {
                // A -> B along d_p, then B -> A along -d_q: R = d_p - d_q, d1 x d2 = -(d_p x d_q). On B the path is
                // B -> A along -d_q, A -> B along d_p: same R, d1 x d2 = d_p x d_q.
                var R = lat.LatticeCoordinates(d[p] - d[q])!.Value;
                var c = d[p].Cross(d[q]);
                hops.Add(new(0, 0, R, FlavourMatrix.Pauli(0, -I * pref * c.X, -I * pref * c.Y, -I * pref * c.Z), $"soA{p}{q}"));
                hops.Add(new(1, 1, R, FlavourMatrix.Pauli(0, I * pref * c.X, I * pref * c.Y, I * pref * c.Z), $"soB{p}{q}"));
            }
        var onsite = new List<OnsiteTerm>();
        if (m != 0)
        {
            onsite.Add(new(0, FlavourMatrix.Identity(2, m), "mA"));
            onsite.Add(new(1, FlavourMatrix.Identity(2, -m), "mB"));
        }
        return new(Model("fkm", lat, 2, [new("A", Vec3.Zero), new("B", tauB)],
            [new("s", 0, OrbitalKind.Conduction), new("s", 1, OrbitalKind.Conduction)], hops.ToArray(), onsite.ToArray(), 2));
    }

    /// <summary>
    /// Periodic Anderson lattice on a simple-cubic lattice at the mean-field level: conduction band
    /// eps(k) = -2t sum cos(k_i a), a correlated level ef on the same site, local hybridization V, spin-1/2.
    /// Bands E(k) = (eps + ef)/2 +- sqrt(((eps - ef)/2)^2 + V^2).
    /// </summary>
    public static BlochHamiltonian Hybridized(double t, double v, double ef, double a = 1.0)
    {
        var amp = FlavourMatrix.Identity(2, -t);
        return new(Model("pam", Lattice.Create(LatticeKind.SimpleCubic, a), 2, [new("Ce", Vec3.Zero)],
            [new("d", 0, OrbitalKind.Conduction), new("f", 0, OrbitalKind.Correlated)],
            [new(0, 0, (1, 0, 0), amp, "x"), new(0, 0, (0, 1, 0), amp, "y"), new(0, 0, (0, 0, 1), amp, "z"),
             new(0, 1, (0, 0, 0), FlavourMatrix.Identity(2, v), "V")],
            [new(1, FlavourMatrix.Identity(2, ef), "ef")], 2));
    }

    /// <summary>A k.p source H(k) = s v (k - k0).sigma (not periodic): for chirality tests at one point.</summary>
    public sealed class KpWeyl(double velocity, Vec3 k0, int sign) : IBlochSource
    {
        public BoundModel Model { get; } = LatticeWeyl(1, Math.PI / 2, 1).Model;
        public int Size => 2;
        public void Assemble(Vec3 k, Span<Complex> h, Span<Complex> scratch)
        {
            var q = (sign * velocity) * (k - k0);
            h[0] = q.Z; h[1] = new Complex(q.X, -q.Y); h[2] = new Complex(q.X, q.Y); h[3] = -q.Z;
        }
    }
}
