using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Numerics;

namespace Meanfield.Tests.Models;

/// <summary>
/// The generated Fu-Kane-Mele model against Fu, Kane and Mele, PRL 98, 106803 (2007): with nearest-neighbour t and
/// spin-orbit lambda the spectrum has a fourfold zero-energy level (Dirac point) at the three X points for any
/// lambda and a gap at a generic k; a [111] bond distortion dt gives E(X) = +-|dt|. Nearest-neighbour diamond bands
/// E(Gamma) = +-4t, E(L) = +-2t (from |sum of the four bond phases|, derived in the comments). Time reversal with
/// inversion makes every band twofold degenerate at any k (Kramers; common practice).
/// </summary>
public class FuKaneMeleTests
{
    private const double A = 5.0, T = 1.0;

    private static BoundModel Diamond(double lso, double dt = 0)
    {
        string text = $$"""
            [model]
            electrons_per_cell = 2
            [parameters]
            t = {{T}}
            lso = {{lso.ToString(System.Globalization.CultureInfo.InvariantCulture)}}
            dt = {{dt.ToString(System.Globalization.CultureInfo.InvariantCulture)}}
            [lattice]
            kind = "diamond"
            constant = {{A}}
            [[site]]
            name = "A"
            orbitals = ["s"]
            [[site]]
            name = "B"
            orbitals = ["s"]
            [[hopping]]
            from = "A:s"
            to = "B:s"
            neighbour = 1
            amplitude = "t"
            [[spin_orbit_diamond]]
            orbital = "s"
            amplitude = "lso"
            """ + (dt != 0 ? "\n[[hopping]]\nfrom = \"A:s\"\nto = \"B:s\"\nvector = [0, 0, 0]\namplitude = \"dt\"\n" : "");
        return ModelText.Bind(text);
    }

    private static double[] Spectrum(BoundModel model, Vec3 k)
    {
        int n = model.BasisSize;
        var bloch = new BlochHamiltonian(model);
        var h = new Complex[n * n];
        var scratch = new Complex[n * n];
        bloch.Assemble(k, h, scratch);
        var values = new double[n];
        Eigensolvers.Create(n).Solve(h, values, Span<Complex>.Empty);
        return values;
    }

    private static Vec3 Cubic(double x, double y, double z) => (2 * Math.PI / A) * new Vec3(x, y, z);

    public static TheoryData<double> Lambdas => [0.05, 0.1, 0.2];

    [Theory]
    [MemberData(nameof(Lambdas))]
    public void Fourfold_zero_at_the_three_X_points(double lso)
    {
        var model = Diamond(lso * T);
        foreach (var x in new[] { Cubic(1, 0, 0), Cubic(0, 1, 0), Cubic(0, 0, 1) })
            Assert.All(Spectrum(model, x), e => Assert.True(Math.Abs(e) < 1e-9 * T, $"E(X) = {e}"));
    }

    [Theory]
    [MemberData(nameof(Lambdas))]
    public void Gapped_and_Kramers_degenerate_at_generic_k(double lso)
    {
        var model = Diamond(lso * T);
        var rng = new Random(7);
        for (int s = 0; s < 5; s++)
        {
            var k = Cubic(rng.NextDouble(), rng.NextDouble(), rng.NextDouble());
            var e = Spectrum(model, k);
            Assert.Equal(e[0], e[1], 9);
            Assert.Equal(e[2], e[3], 9);
            Assert.True(e[2] - e[1] > 1e-3 * T, $"gap {e[2] - e[1]} at {k}");
        }
    }

    [Fact]
    public void Without_spin_orbit_the_bands_touch_along_X_W()
    {
        // With lambda = 0 the nearest-neighbour bands touch on the whole X-W line (Fu, Kane & Mele, PRL 98, 106803 (2007): the four bond phases
        // cancel there), so the spin-orbit term is what gaps the generic point: a check that it is generated at all.
        var w = Cubic(1, 0.5, 0);
        Assert.All(Spectrum(Diamond(0), w), e => Assert.True(Math.Abs(e) < 1e-9));
        Assert.True(Spectrum(Diamond(0.1), w).Max() > 0.1);
    }

    [Fact]
    public void Nearest_neighbour_bands_at_Gamma_and_L()
    {
        // Gamma: all four phases are 1, |sum| = 4t. L = (pi/a)(1,1,1): phases e^{3i pi/4} and three e^{-i pi/4},
        // |sum| = |sqrt2 - i sqrt2| = 2t.
        var model = Diamond(0);
        var g = Spectrum(model, Vec3.Zero);
        Assert.Equal([-4, -4, 4, 4], g.Select(e => Math.Round(e, 9)));
        var l = Spectrum(model, Cubic(0.5, 0.5, 0.5));
        Assert.Equal([-2, -2, 2, 2], l.Select(e => Math.Round(e, 9)));
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(-0.2)]
    public void Bond_distortion_opens_X_to_plus_minus_dt(double dt)
    {
        var model = Diamond(0.1, dt);
        foreach (var x in new[] { Cubic(1, 0, 0), Cubic(0, 1, 0), Cubic(0, 0, 1) })
        {
            var e = Spectrum(model, x);
            Assert.Equal(-Math.Abs(dt), e[0], 9);
            Assert.Equal(-Math.Abs(dt), e[1], 9);
            Assert.Equal(Math.Abs(dt), e[2], 9);
            Assert.Equal(Math.Abs(dt), e[3], 9);
        }
    }

    [Fact]
    public void Spin_orbit_bonds_have_the_tetrahedral_geometry()
    {
        // 12 next-nearest neighbours per site, 6 stored (h.c. gives the rest). |d1 x d2| = |d|^2 sin(theta) with
        // |d| = sqrt(3)a/4 and cos(theta) = 1/3 between a bond and the reverse of another (tetrahedral angle),
        // so |(8/a^2) d1 x d2| = sqrt(2), and d1 x d2 is perpendicular to d = d1 + d2.
        var lattice = Lattice.Create(LatticeKind.Diamond, A);
        var basis = Lattice.DefaultBasis(LatticeKind.Diamond, A)!;
        for (int site = 0; site < 2; site++)
        {
            var bonds = FuKaneMeleTerm.Bonds(lattice, basis, site)!;
            Assert.Equal(6, bonds.Count);
            foreach (var b in bonds)
            {
                Assert.Equal(Math.Sqrt(2), b.V.Norm, 12);
                Assert.Equal(0, b.V.Dot(lattice.LatticeVector(b.R.N1, b.R.N2, b.R.N3)), 12);
            }
        }
        // The term is odd under exchange of the sublattices: the same displacement has opposite vectors on A and B.
        var a = FuKaneMeleTerm.Bonds(lattice, basis, 0)!;
        var bb = FuKaneMeleTerm.Bonds(lattice, basis, 1)!;
        foreach (var x in a)
        {
            var y = bb.Single(z => z.R == x.R);
            Assert.True((x.V + y.V).Norm < 1e-12);
        }
    }

    [Fact]
    public void Stored_spin_orbit_amplitudes_are_i_lambda_v_dot_sigma()
    {
        var model = Diamond(0.1);
        var so = model.Hoppings.Where(h => h.From == h.To).ToList();
        Assert.Equal(12, so.Count); // 6 per site, 2 sites
        foreach (var h in so)
        {
            // i lambda v.sigma is anti-Hermitian times i: traceless, and its square is -(lambda |v|)^2 = -0.02.
            var m = h.Amplitude;
            Assert.Equal(0, (m[0, 0] + m[1, 1]).Magnitude, 12);
            var sq00 = m[0, 0] * m[0, 0] + m[0, 1] * m[1, 0];
            Assert.Equal(-0.02, sq00.Real, 12);
        }
    }
}
