using Meanfield.Analysis.Bands;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Bands;

public class BandStructureTests
{
    private const double A = 4.0, T = 25.0;

    private static BandStructure Compute(Meanfield.Binding.BoundModel model, int points = 121) =>
        BandStructure.Compute(new BlochHamiltonian(model), BandPath.Default(model.Lattice).Sample(points));

    private static double At(BandStructure b, string label, int band = 0)
    {
        for (int k = 0; k < b.KCount; k++) if (b.Path.Labels[k] == label) return b.Energy(k, band);
        throw new InvalidOperationException(label);
    }

    [Fact]
    public void SimpleCubicEdgesAndVanHoveEnergies()
    {
        // eps(k) = -2t (cos kx a + cos ky a + cos kz a): band edges -6t at Gamma and +6t at R, van Hove energies
        // -2t at X and +2t at M (Economou, Green's Functions in Quantum Physics, 3rd ed. (2006), ch. 5).
        var b = Compute(TightBindingModels.SimpleCubic(A, T));
        Assert.Equal(-6 * T, At(b, "G"), 9);
        Assert.Equal(6 * T, At(b, "R"), 9);
        Assert.Equal(-2 * T, At(b, "X"), 9);
        Assert.Equal(2 * T, At(b, "M"), 9);
        for (int k = 0; k < b.KCount; k++)
        {
            var q = b.Path.K[k];
            double eps = -2 * T * (Math.Cos(q.X * A) + Math.Cos(q.Y * A) + Math.Cos(q.Z * A));
            Assert.Equal(eps, b.Energy(k, 0), 9);
        }
    }

    [Fact]
    public void BodyCentredEdgesAndZeroAtNAndP()
    {
        // eps(k) = -8t cos(kx a/2) cos(ky a/2) cos(kz a/2): band [-8t, 8t] (Economou ch. 5); at N = (1/2,1/2,0) 2pi/a and
        // P = (1/2,1/2,1/2) 2pi/a a cosine of pi/2 vanishes, so E = 0; at H = (0,0,1) 2pi/a, E = +8t.
        var b = Compute(TightBindingModels.BodyCentred(A, T));
        Assert.Equal(-8 * T, At(b, "G"), 9);
        Assert.Equal(8 * T, At(b, "H"), 9);
        Assert.Equal(0, At(b, "N"), 9);
        Assert.Equal(0, At(b, "P"), 9);
        var (lo, hi) = b.EnergyRange();
        Assert.InRange(lo, -8 * T - 1e-9, -8 * T + 1e-9);
        Assert.InRange(hi, 8 * T - 1e-9, 8 * T + 1e-9);
    }

    [Fact]
    public void FaceCentredBandAndFlatXWLine()
    {
        // eps(k) = -4t sum_{i<j} cos(k_i a/2) cos(k_j a/2): band [-12t, 4t], flat at 4t along X-W (Economou ch. 5).
        var b = Compute(TightBindingModels.FaceCentred(A, T), 241);
        Assert.Equal(-12 * T, At(b, "G"), 9);
        Assert.Equal(4 * T, At(b, "X"), 9);
        Assert.Equal(0, At(b, "L"), 9);       // all three cosines vanish at L = (1/2,1/2,1/2) 2pi/a
        var (lo, hi) = b.EnergyRange();
        Assert.True(lo >= -12 * T - 1e-9 && hi <= 4 * T + 1e-9, $"band [{lo}, {hi}]");
        int x = b.Path.Ticks[1].Index, w = b.Path.Ticks[2].Index;
        Assert.Equal(["X", "W"], new[] { b.Path.Ticks[1].Label, b.Path.Ticks[2].Label });
        Assert.True(w - x > 5);
        for (int k = x; k <= w; k++) Assert.Equal(4 * T, b.Energy(k, 0), 9);
    }

    [Fact]
    public void DiamondTouchesAlongXWAndHasTextbookValuesAtGammaAndL()
    {
        // Nearest-neighbour diamond: E(Gamma) = +-4t, E(L) = +-2t, E = 0 on the whole X-W line
        // (Fu, Kane & Mele, PRL 98, 106803 (2007), the lambda = 0 limit of their model).
        var b = Compute(TightBindingModels.Diamond(A, T), 241);
        Assert.Equal(-4 * T, At(b, "G", 0), 9); Assert.Equal(4 * T, At(b, "G", 1), 9);
        Assert.Equal(-2 * T, At(b, "L", 0), 9); Assert.Equal(2 * T, At(b, "L", 1), 9);
        int x = b.Path.Ticks[1].Index, w = b.Path.Ticks[2].Index;
        for (int k = x; k <= w; k++) { Assert.Equal(0, b.Energy(k, 0), 9); Assert.Equal(0, b.Energy(k, 1), 9); }
        // Away from the touching line each bonding/antibonding state lives half on each site (sublattice symmetry).
        for (int k = 0; k < x; k++)
            for (int n = 0; n < 2; n++)
            {
                Assert.Equal(0.5, b.SiteWeight(k, n, 0), 9);
                Assert.Equal(0.5, b.SiteWeight(k, n, 1), 9);
                Assert.Equal(0, b.CorrelatedWeight(k, n), 12);
            }
    }

    [Fact]
    public void CorrelatedWeightOfTheHybridizedTwoLevelProblem()
    {
        // H(k) = [[eps_c, V], [V, eps_f]] per spin. Eigenvector of E: (V, E - eps_c) up to normalization, so the
        // f weight is (E - eps_c)^2 / ((E - eps_c)^2 + V^2) (two-level problem, common practice); the f weights of all
        // bands add up to the number of f states (2 here) at every k.
        double v = 12, epsF = 7;
        var model = TightBindingModels.HybridizedCubic(A, T, v, epsF);
        var b = Compute(model, 60);
        Assert.Equal(4, b.BandCount);
        for (int k = 0; k < b.KCount; k++)
        {
            var q = b.Path.K[k];
            double ec = -2 * T * (Math.Cos(q.X * A) + Math.Cos(q.Y * A) + Math.Cos(q.Z * A));
            double mid = 0.5 * (ec + epsF), half = Math.Sqrt(0.25 * (ec - epsF) * (ec - epsF) + v * v);
            double sum = 0;
            for (int n = 0; n < 4; n++)
            {
                double e = n < 2 ? mid - half : mid + half;
                Assert.Equal(e, b.Energy(k, n), 8);
                double wf = (e - ec) * (e - ec) / ((e - ec) * (e - ec) + v * v);
                Assert.Equal(wf, b.CorrelatedWeight(k, n), 8);
                Assert.Equal(1, b.SiteWeight(k, n, 0), 9);
                sum += b.CorrelatedWeight(k, n);
            }
            Assert.Equal(2, sum, 9);
        }
    }
}
