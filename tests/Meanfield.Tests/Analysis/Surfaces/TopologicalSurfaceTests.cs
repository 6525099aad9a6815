using System.Numerics;
using Meanfield.Analysis.Surfaces;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Numerics;
using Meanfield.Renormalization;
using Meanfield.Solver;

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
    /// nu0 from parities. Inversion about the bond centre tau_B / 2 maps A to B; with Bloch phases that include the site positions, at a TRIM k its
    /// matrix is &lt;A|P|B&gt; = e^{i k.tau_B}, &lt;B|P|A&gt; = e^{-i k.tau_B} (identity on spin), derived from
    /// P|s, R&gt; = |s', -R&gt; and |s, -k&gt; = e^{-i G.tau_s} |s, k&gt; for -k = k - G.
    /// </summary>
    private static int StrongIndex(IBlochSource h)
    {
        var model = h.Model;
        var lat = model.Lattice;
        var tauB = model.Sites[1].Position;
        int n = h.Size, f = model.Flavours;
        // Partner of each orbital on site A: the orbital of the same name on site B.
        var pairs = new List<(int A, int B)>();
        for (int o = 0; o < model.Orbitals.Count; o++)
            if (model.Orbitals[o].Site == 0)
                pairs.Add((o, Enumerable.Range(0, model.Orbitals.Count).Single(q => model.Orbitals[q].Site == 1 && model.Orbitals[q].Name == model.Orbitals[o].Name)));
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
            foreach (var (oa, ob) in pairs)
                for (int a = 0; a < f; a++)
                {
                    int ia = oa * f + a, ib = ob * f + a;
                    xi += Complex.Conjugate(v[ia * n]) * phase * v[ib * n] + Complex.Conjugate(v[ib * n]) * Complex.Conjugate(phase) * v[ia * n];
                }
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

    [Fact]
    public void Shipped_Weyl_model_without_inversion_breaking_is_a_topological_Kondo_insulator_with_a_heavy_surface_cone()
    {
        // Dzero, Sun, Galitski & Coleman, PRL 104, 106408 (2010): a Kondo insulator whose heavy bands carry a strong Z2
        // index has an odd number of surface Dirac cones inside the Kondo gap. The mean field at m = 0 keeps inversion,
        // so the index comes from parities (Fu & Kane 2007) of the renormalized bands; the slab uses the bulk saddle point.
        var path = Path.Combine(Meanfield.Tests.Models.ModelText.RepositoryRoot(), "models", "weyl-diamond.toml");
        var model = ModelBinder.Bind(ModelFile.Load(path), new Dictionary<string, string> { ["m"] = "0" });
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = 0.2585, Mesh = 8, Shifted = true }).Solve();
        Assert.True(sp.Converged);
        Assert.Equal(SaddlePointBranch.Kondo, sp.Branch);
        var heavy = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        Assert.Equal(1, StrongIndex(heavy));
        var bonds = SurfaceCut.BondsOf(heavy);
        foreach (var (face, top) in new[] { ((1, 1, 1), "B"), ((0, 0, 1), "A") })
        {
            var cut = new SurfaceCut(bonds, LatticePlane.FromIndices(bonds.Lattice, face.Item1, face.Item2, face.Item3), top);
            var points = SurfaceStateCounting.DiracPoints(new Slab(cut, 24), 2 * cut.ElementaryLayers, 6);
            string where = string.Join(", ", points.Select(p => $"{p.Label} {p.Energy - sp.Mu:F3} meV"));
            Assert.True(points.Count % 2 == 1, $"{face} {top}: {points.Count} surface Dirac point(s): {where}");
            // Inside the Kondo gap: within a few meV of mu, against a conduction scale of hundreds of meV.
            Assert.All(points, p => Assert.InRange(p.Energy - sp.Mu, -2.0, 2.0));
        }
    }
}
