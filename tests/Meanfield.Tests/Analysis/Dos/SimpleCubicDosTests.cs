using Meanfield.Analysis.Dos;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Dos;

public class SimpleCubicDosTests
{
    private const double T = 0.5; // hopping in energy units (invented)

    private static TetrahedronDos Dos(int n) => new(AnalysisModels.SimpleCubic(T), new KMesh(Lattice.Create(LatticeKind.SimpleCubic, 1.0), n));

    [Fact]
    public void BandEdgesNormalisationAndVanHoveCusp()
    {
        var dos = Dos(24).Compute(new DosOptions { Points = 1201, Minimum = -4 * T * 2, Maximum = 4 * T * 2 });
        double step = dos.Step, integral = 0, second = 0, peakE = 0, peak = 0;
        for (int i = 0; i < dos.Energies.Length; i++)
        {
            double e = dos.Energies[i], d = dos.Total[i];
            // Band edges +-6t: Economou, Green's Functions in Quantum Physics (3rd ed. 2006), ch. 5.
            if (Math.Abs(e) > 6 * T * (1 + 1e-9)) Assert.Equal(0.0, d);
            if (Math.Abs(e) < 5.8 * T) Assert.True(d > 0, $"DOS vanishes inside the band at {e}");
            integral += d * step;
            second += d * e * e * step;
            if (e > 0.5 * T && d > peak) { peak = d; peakE = e; }
        }
        Assert.InRange(integral, 1 - 2e-3, 1 + 2e-3);
        Assert.Equal(1.0, dos.Integrated[^1], 12);                       // one state per cell above the band
        // Second moment <eps^2> = z t^2 = 6 t^2 (Economou, ch. 5); linear interpolation inside the tetrahedra
        // lowers it by O(1/N^2) (about 1 % at 24^3).
        Assert.InRange(second / (6 * T * T), 0.98, 1.002);
        // Van Hove cusp at 2t with rho(2t) = 0.1446993444 / t (Economou, Green's Functions in Quantum Physics, ch. 5; value recomputed from Watson-type lattice integrals, from memory).
        Assert.InRange(peakE / T, 1.85, 2.15);
        Assert.InRange(peak * T, 0.1447 * 0.97, 0.1447 * 1.03);
    }

    [Fact]
    public void SpectrumIsSymmetricForTheBipartiteLattice()
    {
        // k -> k + (pi, pi, pi)/a maps eps -> -eps and the mesh onto itself (common practice: bipartite lattices).
        var dos = Dos(16).Compute(new DosOptions { Points = 401, Minimum = -7 * T, Maximum = 7 * T });
        for (int i = 0; i < 401; i++) Assert.Equal(dos.Total[i], dos.Total[400 - i], 9);
    }

    [Fact]
    public void CentreValueConvergesToWatsonIntegral()
    {
        // rho(0) = W_fcc / (pi t) = 0.1426729827 / t, with W_fcc = 3 Gamma(1/3)^6 / (2^(14/3) pi^4)
        // (Watson, Q. J. Math. 10, 266 (1939); Glasser & Zucker, PNAS 74, 1800 (1977)).
        const double exact = 0.1426729827 / T;
        double previous = double.PositiveInfinity, last = 0;
        foreach (int n in new[] { 16, 24, 32 })
        {
            double err = Math.Abs(Dos(n).DosAtEnergy(0).Total - exact) / exact;
            Assert.True(err < previous, $"mesh {n}: error {err} did not decrease from {previous}");
            previous = err; last = err;
        }
        Assert.True(last < 1e-2, $"relative error {last} at 32^3");
    }

    [Fact]
    public void GaussianOptionIsNormalisedAndCloseToTetrahedra()
    {
        var d = Dos(16);
        var g = d.Compute(new DosOptions { Method = DosMethod.Gaussian, Sigma = 0.2 * T, Points = 801 });
        double integral = 0;
        foreach (var v in g.Total) integral += v * g.Step;
        Assert.InRange(integral, 0.999, 1.001);
        Assert.Equal(1.0, g.Integrated[^1], 6);
        Assert.Throws<ArgumentOutOfRangeException>(() => d.Compute(new DosOptions { Method = DosMethod.Gaussian }));
    }

    [Fact]
    public void SquareLatticeTrianglesIntegrateAndHaveEdges()
    {
        // 2D square band: edges +-4t, log van Hove singularity at 0 (Economou, ch. 5).
        var src = AnalysisModels.Square(T);
        var dos = new TetrahedronDos(src, new KMesh(src.Model.Lattice, 64)).Compute(new DosOptions { Points = 801, Minimum = -5 * T, Maximum = 5 * T });
        Assert.Equal(1.0, dos.Integrated[^1], 12);
        Assert.Equal(0.0, dos.Total[0]);
        int centre = 400;
        Assert.True(dos.Total[centre] > 2 * dos.Total[centre + 200], "log peak at the band centre");
        Assert.Equal(0.5, dos.Integrated[centre], 3);
    }
}
