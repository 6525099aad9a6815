using System.Numerics;
using Meanfield.Analysis.Surfaces;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Tests.Analysis.Surfaces;

/// <summary>
/// Surface Dirac cones of the Fu-Kane-Mele diamond model (Fu, Kane &amp; Mele, PRL 98, 106803 (2007)): a strong
/// topological insulator has an odd number of surface Dirac points on every face, a weak one an even number. Which
/// sign of the [111] bond distortion dt is strong is read here from the parity criterion of Fu &amp; Kane, PRB 76,
/// 045302 (2007), Eq. (3.10): (-1)^nu0 = prod over the eight TRIM of delta_i, delta_i the product of the inversion
/// eigenvalues of the occupied Kramers pairs.
/// </summary>
public sealed class TopologicalSurfaceTests
{
    private const double Lambda = 0.125;

    /// <summary>
    /// nu0 from parities. Inversion about the bond centre tau_B / 2 maps A to B; in Bloch convention II at a TRIM k its
    /// matrix is &lt;A|P|B&gt; = e^{i k.tau_B}, &lt;B|P|A&gt; = e^{-i k.tau_B} (identity on spin), derived from
    /// P|s, R&gt; = |s', -R&gt; and |s, -k&gt; = e^{-i G.tau_s} |s, k&gt; for -k = k - G.
    /// </summary>
    private static int StrongIndex(BlochHamiltonian h)
    {
        var lat = h.Model.Lattice;
        var tauB = h.Model.Sites[1].Position;
        int n = h.Size;
        var m = new Complex[n * n]; var s = new Complex[n * n]; var v = new Complex[n * n]; var e = new double[n];
        var solver = Eigensolvers.Create(n);
        int product = 1;
        for (int u = 0; u < 8; u++)
        {
            var k = lat.Cartesian(0.5 * (u & 1), 0.5 * ((u >> 1) & 1), 0.5 * ((u >> 2) & 1));
            h.Assemble(k, m, s);
            solver.Solve(m, e, v);
            var phase = Complex.FromPolarCoordinates(1, k.Dot(tauB));
            // xi = <psi|P|psi> for the lowest state (its Kramers partner has the same parity).
            Complex xi = 0;
            for (int a = 0; a < 2; a++)
                xi += Complex.Conjugate(v[a * n]) * phase * v[(2 + a) * n] + Complex.Conjugate(v[(2 + a) * n]) * Complex.Conjugate(phase) * v[a * n];
            Assert.True(Math.Abs(Math.Abs(xi.Real) - 1) < 1e-8 && Math.Abs(xi.Imaginary) < 1e-8, $"parity {xi} at TRIM {u}");
            product *= Math.Sign(xi.Real);
        }
        return product < 0 ? 1 : 0;
    }

    [Theory]
    [InlineData(1, 1, 1, "A")]
    [InlineData(1, 1, 1, "B")]
    [InlineData(0, 0, 1, "A")]
    public void Strong_phase_has_an_odd_number_of_surface_Dirac_points_and_the_weak_phase_an_even_number(int h, int k, int l, string top)
    {
        int strongSeen = 0;
        foreach (double dt in new[] { 0.4, -0.4 })
        {
            var bulk = SurfaceModels.FuKaneMele(1, Lambda, dt);
            int nu0 = StrongIndex(bulk);
            strongSeen += nu0;
            var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, h, k, l), top);
            var slab = new Slab(cut, 20);
            var points = SurfaceStateCounting.DiracPoints(slab, 2 * cut.ElementaryLayers, 5);
            string where = string.Join(", ", points.Select(p => $"{p.Label} {p.Energy:F3} ({p.TopWeight:F2})"));
            Assert.True(points.Count % 2 == nu0, $"dt = {dt}: nu0 = {nu0}, {points.Count} surface Dirac point(s): {where}");
            if (nu0 == 1) Assert.NotEmpty(points);
        }
        // The two signs of the distortion are the two phases (Fu, Kane & Mele 2007).
        Assert.Equal(1, strongSeen);
    }
}
