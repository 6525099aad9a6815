using Meanfield.Analysis.Dos;
using Meanfield.Lattices;
using Xunit.Abstractions;

namespace Meanfield.Tests.Analysis.Dos;

/// <summary>
/// The T = 0 integration weights of one simplex: w_i(E) = integral of corner i's barycentric coordinate over the part of
/// the simplex below E (Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994), App. B). Checked against a direct sampling
/// of that integral, against the occupied fraction, and against the independent cross-section weights dw_i/dE.
/// </summary>
public class SimplexIntegrationWeightTests(ITestOutputHelper output)
{
    public static TheoryData<double[]> Tetrahedra => new()
    {
        new[] { -1.0, -0.3, 0.4, 2.0 },
        new[] { 0.0, 0.0, 1.0, 3.0 },      // degenerate lowest pair
        new[] { -2.0, 0.5, 0.5, 0.5 },     // degenerate top triple
        new[] { 0.1, 0.2, 0.25, 0.9 },
    };

    /// <summary>
    /// Monte Carlo: barycentric coordinates of uniform points in a simplex are Dirichlet(1, ..., 1), i.e. the spacings of
    /// sorted uniforms (common practice). The linear energy at a point is sum_i l_i e_i.
    /// </summary>
    private static double[] Sampled(double[] e, double energy, int samples)
    {
        var rng = new Random(12345);
        int n = e.Length;
        var w = new double[n];
        var u = new double[n + 1];
        for (int s = 0; s < samples; s++)
        {
            u[0] = 0; u[n] = 1;
            for (int i = 1; i < n; i++) u[i] = rng.NextDouble();
            Array.Sort(u, 1, n - 1);
            double en = 0;
            for (int i = 0; i < n; i++) en += (u[i + 1] - u[i]) * e[i];
            if (en >= energy) continue;
            for (int i = 0; i < n; i++) w[i] += (u[i + 1] - u[i]) / samples;
        }
        return w;
    }

    [Theory]
    [MemberData(nameof(Tetrahedra))]
    public void TetrahedronWeightsAreBarycentricIntegrals(double[] e)
    {
        const int samples = 200_000;
        var w = new double[4];
        var g = new double[4];
        for (double energy = e[0] - 0.1; energy <= e[3] + 0.1; energy += (e[3] - e[0] + 0.2) / 13)
        {
            double sum = SimplexKernel.TetraIntegrationWeights(e, energy, w);
            Assert.Equal(SimplexKernel.TetraFraction(e, energy), sum, 12);
            Assert.Equal(sum, w.Sum(), 12);
            var mc = Sampled(e, energy, samples);
            // A Dirichlet(1,1,1,1) component has variance 3/80, so the standard error over 2e5 samples is 4.3e-4.
            for (int i = 0; i < 4; i++) Assert.True(Math.Abs(mc[i] - w[i]) < 3e-3, $"E = {energy}: w[{i}] = {w[i]}, sampled {mc[i]}");
            // dw_i/dE equals the cross-section corner weight (derived independently in SimplexKernel.TetraCornerWeights).
            double h = 1e-6 * (e[3] - e[0]);
            var wp = new double[4]; var wm = new double[4];
            SimplexKernel.TetraIntegrationWeights(e, energy + h, wp);
            SimplexKernel.TetraIntegrationWeights(e, energy - h, wm);
            SimplexKernel.TetraCornerWeights(e, energy, g, bloechl: false);
            for (int i = 0; i < 4; i++) Assert.Equal(g[i], (wp[i] - wm[i]) / (2 * h), 5);
        }
    }

    [Fact]
    public void TriangleWeightsAreBarycentricIntegrals()
    {
        double[][] triangles = [[-1.0, 0.2, 1.5], [0.0, 0.0, 1.0], [-0.5, 1.0, 1.0]];
        var w = new double[3];
        foreach (var e in triangles)
            for (double energy = e[0] - 0.1; energy <= e[2] + 0.1; energy += (e[2] - e[0] + 0.2) / 11)
            {
                double sum = SimplexKernel.TriangleIntegrationWeights(e, energy, w);
                Assert.Equal(SimplexKernel.TriangleFraction(e, energy), sum, 12);
                var mc = Sampled(e, energy, 100_000);
                for (int i = 0; i < 3; i++) Assert.True(Math.Abs(mc[i] - w[i]) < 4e-3, $"E = {energy}: w[{i}] = {w[i]}, sampled {mc[i]}");
                double h = 1e-6;
                Assert.Equal(SimplexKernel.TriangleDensity(e, energy),
                             (SimplexKernel.TriangleFraction(e, energy + h) - SimplexKernel.TriangleFraction(e, energy - h)) / (2 * h), 5);
            }
    }

    /// <summary>
    /// A shifted mesh is the Gamma-centred one translated by half a step, so its tetrahedra tile the same periodic zone:
    /// the simple-cubic DOS and integrated DOS from both converge to the same function (common practice). The band
    /// centre of the integrated DOS is 1/2 on both (particle-hole symmetry of the bipartite lattice; Economou, Green's
    /// Functions in Quantum Physics (3rd ed. 2006), ch. 5).
    /// </summary>
    [Fact]
    public void ShiftedAndGammaMeshesGiveTheSameIntegrals()
    {
        const double t = 0.5;
        var src = AnalysisModels.SimpleCubic(t);
        var options = new DosOptions { Points = 25, Minimum = -6 * t, Maximum = 6 * t };
        double previous = double.PositiveInfinity;
        foreach (int n in new[] { 8, 16 })
        {
            var gamma = new TetrahedronDos(src, new KMesh(src.Model.Lattice, n)).Compute(options);
            var shifted = new TetrahedronDos(src, new KMesh(src.Model.Lattice, n, shifted: true)).Compute(options);
            Assert.Equal(0.5, shifted.Integrated[12], 12);
            Assert.Equal(1.0, shifted.Integrated[^1], 12);
            double diff = 0;
            for (int i = 0; i < options.Points; i++) diff = Math.Max(diff, Math.Abs(gamma.Integrated[i] - shifted.Integrated[i]));
            output.WriteLine($"mesh {n}: max |N_gamma - N_shifted| = {diff:G3}");
            Assert.True(diff < previous / 2, $"mesh {n}: difference {diff} did not shrink from {previous}");
            previous = diff;
        }
        Assert.True(previous < 5e-4, $"integrated DOS of the two meshes differs by {previous} at 16^3");
    }
}
