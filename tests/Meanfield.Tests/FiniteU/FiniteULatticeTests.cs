using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Numerics;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Tests.Models;
using Meanfield.Tests.Support;
using Xunit.Abstractions;

namespace Meanfield.Tests.FiniteU;

/// <summary>
/// The finite-U lattice saddle point (paramagnetic four-boson mean field of Kotliar &amp; Ruckenstein, PRL 57, 1362
/// (1986)) against its analytic limits.
/// </summary>
public class FiniteULatticeTests(ITestOutputHelper output)
{
    internal static BoundModel WithU(BoundModel m, double u) => m.With(shells: [.. m.Shells.Select(s => s with { U = u })]);

    /// <summary>
    /// U = 0: the four-boson normalization makes q = 1 at the uncorrelated bosons e = 1 - n/2, d = n/2 (Kotliar &amp;
    /// Ruckenstein 1986, Eq. 5), and with no U d^2 to pay the saddle point is there with lambda = 0: the mean-field bands
    /// are the bare ones (common practice: the non-interacting limit). Started away from it (r = 0.4, lambda = 30), the
    /// iteration must find it; the bands are compared with a bare diagonalisation at a few k-points.
    /// </summary>
    [Fact]
    public void Zero_U_gives_the_bare_bands()
    {
        const double t = 100, v = 60, ef = -150;
        var model = WithU(TestModels.LocalHybridization(LatticeKind.SimpleCubic, t, v, ef, 2, electrons: 2.6), 0);
        var settings = new SolverSettings { Temperature = 5, Mesh = 8, InitialGuess = new MeanFieldAmplitudes([0.4], [30.0]) };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        var g = Assert.Single(sp.Groups);
        output.WriteLine($"U = 0: z = {g.Z:R}, lambda = {g.Lambda:R}, n_f = {g.FOccupation:R}, e = {g.Bosons?.E:R}, d = {g.Bosons?.D:R}, {sp.ZonePasses} passes");
        Assert.Equal(1.0, g.Z, 1e-9);
        Assert.Equal(0.0, g.Lambda, 1e-8 * t);
        Assert.Equal(1 - g.FOccupation / 2, g.Bosons!.Value.E, 1e-8);
        Assert.Equal(g.FOccupation / 2, g.Bosons!.Value.D, 1e-8);

        var bare = new BlochHamiltonian(model);
        var renormalized = new RenormalizedHamiltonian(bare, sp.Amplitudes);
        int n = bare.Size;
        var solver = Eigensolvers.Create(n);
        foreach (var k in new[] { new Vec3(0.1, 0.2, 0.3), new Vec3(0.5, -0.4, 0.2), new Vec3(0.77, 0.77, 0.0) })
        {
            var eb = Eigenvalues(bare, k, n, solver);
            var er = Eigenvalues(renormalized, k, n, solver);
            for (int i = 0; i < n; i++) Assert.Equal(eb[i], er[i], 1e-8 * t);
        }
    }

    private static double[] Eigenvalues(IBlochSource h, Vec3 k, int n, IHermitianEigensolver solver)
    {
        var m = new Complex[n * n]; var s = new Complex[n * n];
        h.Assemble(k, m, s);
        var e = new double[n]; var vec = new Complex[n * n];
        solver.Solve(m, e, vec);
        return e;
    }

    /// <summary>
    /// Kondo-regime slope of ln z against the f level, derived here from the saddle-point equations for the flat
    /// conduction DOS rho = 1/(2D) with local hybridization V, Delta = pi rho V^2, at two electrons per site (the lower
    /// hybridized band full, mu = 0 by particle-hole symmetry of the band). With x = d^2 and the f filling n, the band
    /// energy depends on z only through a^2 = z V^2, and dE_band/dz = (2 Delta/pi) ln(c z) for z -&gt; 0 (both spins;
    /// the lower band integral -2 rho a^2 asinh(D/(2a)) per spin), c a constant. Stationarity of
    /// E = E_band(z(n, x), eps_f + lambda) - lambda n + U x:
    ///   in x:  (2 Delta/pi) ln(c z) z_x + U = 0,   in n:  (2 Delta/pi) ln(c z) z_n = lambda,   and lambda = -eps_f + O(z^2)
    /// (the renormalized level sits at mu; its offset is O(z^2)). Near n = 1 with e and d small (Kondo regime),
    /// z = 2 (e + d)^2 (1 + O(z)), e^2 = 1 - n + x, d^2 = x, so z_x = 2 (e + d)^2 / (e d) and z_n = -2 (e + d)/e. The
    /// ratio of the two equations gives z_n / z_x = eps_f / U, i.e. the share d / (e + d) = -eps_f / U, and then
    /// (2 Delta/pi) ln(c z) = eps_f (U + eps_f) / (2 U):
    ///   d ln z / d eps_f = (pi / (4 Delta)) (1 + 2 eps_f / U)         [= (pi/(2 N Delta)) (1 + 2 eps_f/U), N = 2].
    /// The infinite-U boson gives pi / (N Delta) instead (Newns &amp; Read, Adv. Phys. 36, 799 (1987); Hewson, The Kondo
    /// Problem to Heavy Fermions (1993), ch. 7), twice the U -&gt; infinity limit of the four-boson value: the
    /// Kotliar-Ruckenstein normalization makes z = (1 - n)/(1 - n/2) at U = infinity, whose dz/dn at n = 1 is twice that
    /// of r^2 = 1 - n. (Exact Bethe-ansatz T_K has the exponent pi eps_f (eps_f + U) / (2 Delta U), Hewson ch. 6, from memory:
    /// the four-boson mean field halves it.) Central differences of ln z are exact at the midpoint for an exponent
    /// quadratic in eps_f; the remaining error is of relative order z.
    /// </summary>
    [Theory]
    [InlineData(4.0, -1.2, -1.4)]
    [InlineData(8.0, -0.9, -1.1)]
    public void Kondo_regime_slope_of_ln_z_matches_the_derived_value(double u, double ef1, double ef2)
    {
        const double D = 1, V = 0.2;
        double delta = Math.PI * V * V / (2 * D);
        var z = new double[2];
        var levels = new[] { ef1, ef2 };
        for (int i = 0; i < 2; i++)
        {
            var model = WithU(TestModels.LocalHybridization(LatticeKind.FlatDos, D, V, levels[i], 2, electrons: 2), u);
            var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = 0, Tolerance = 1e-12 }).Solve();
            Assert.True(sp.Converged, string.Join(" ", sp.Notes));
            var g = sp.Groups[0];
            var b = g.Bosons!.Value;
            z[i] = g.Z;
            // The share d/(e + d) = (mu - eps_f)/U of the derivation (mu = 0 here), to relative order z.
            Assert.Equal(-levels[i] / u, b.D / (b.E + b.D), 0.02 * -levels[i] / u);
            Assert.InRange(g.Z, 1e-5, 0.01); // the Kondo regime the derivation assumes
        }
        double mid = 0.5 * (ef1 + ef2);
        double slope = Math.Log(z[0] / z[1]) / (ef1 - ef2);
        double derived = Math.PI / (4 * delta) * (1 + 2 * mid / u);
        output.WriteLine($"U = {u}, eps_f = {mid}: d ln z/d eps_f = {slope:G6}, derived (pi/(4 Delta))(1 + 2 eps_f/U) = {derived:G6}; infinite-U boson pi/(N Delta) = {Math.PI / (2 * delta):G6}");
        Assert.Equal(derived, slope, 0.02 * derived);
    }

    /// <summary>
    /// Particle-hole symmetry: the flat band with two electrons per site and eps_f = -U/2 (mu = 0) is symmetric under
    /// particle-hole exchange, which maps n_f to 2 - n_f and e to d, so the saddle point has n_f = 1 and e = d
    /// (common practice; in the Kondo-regime derivation above this is the share d/(e + d) = -eps_f/U = 1/2).
    /// </summary>
    [Theory]
    [InlineData(1.0)]
    [InlineData(3.0)]
    public void Symmetric_point_has_one_f_electron_and_equal_empty_and_double_bosons(double u)
    {
        var model = WithU(TestModels.LocalHybridization(LatticeKind.FlatDos, 1, 0.3, -u / 2, 2, electrons: 2), u);
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = 0, Tolerance = 1e-12, DosNodes = 4096 }).Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        var g = sp.Groups[0];
        var b = g.Bosons!.Value;
        output.WriteLine($"U = {u}: n_f = {g.FOccupation:R}, e = {b.E:R}, d = {b.D:R}, z = {g.Z:G6}, level - mu = {g.RenormalizedLevel:G3}");
        Assert.Equal(1.0, g.FOccupation, 1e-9);
        Assert.Equal(b.E, b.D, 1e-9);
        Assert.Equal(0.0, g.RenormalizedLevel, 1e-9);
    }

    /// <summary>
    /// U far above every other energy: the double occupancy vanishes and z tends to the U = infinity value of the
    /// four-boson factor, z = (1 - n)/(1 - n/2) (Kotliar &amp; Ruckenstein 1986, Eq. 5 with d = 0; the Gutzwiller factor),
    /// not the infinite-U boson's r^2 = 1 - n (the normalization difference explained in models/README.md).
    /// </summary>
    [Fact]
    public void Very_large_U_has_no_double_occupancy_and_the_Gutzwiller_factor()
    {
        var model = WithU(TestModels.LocalHybridization(LatticeKind.FlatDos, 1, 0.4, -0.2, 2, electrons: 1.6), 1e6);
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = 0.002, Tolerance = 1e-12, DosNodes = 4096 }).Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        var g = sp.Groups[0];
        double n = g.FOccupation;
        output.WriteLine($"n_f = {n:R}, d^2 = {g.Bosons!.Value.D * g.Bosons!.Value.D:G3}, z = {g.Z:R}, (1 - n)/(1 - n/2) = {(1 - n) / (1 - n / 2):R}, 1 - n = {1 - n:R}");
        Assert.InRange(g.Bosons!.Value.D * g.Bosons!.Value.D, 0, 1e-6);
        Assert.Equal((1 - n) / (1 - n / 2), g.Z, 1e-5);
    }

    /// <summary>Shells at finite and infinite U in one model are refused (one mean field per model).</summary>
    [Fact]
    public void Mixed_finite_and_infinite_U_is_refused()
    {
        var model = TestModels.TwoSublattice(100, 50, -200, 0, 2);
        var mixed = model.With(shells: [model.Shells[0] with { U = 300 }, model.Shells[1]]);
        var ex = Assert.Throws<RequestError>(() => new SaddlePointSolver(mixed, new SolverSettings { Mesh = 4 }));
        Assert.Contains("every shell", ex.Message);
    }

    /// <summary>The mean-field Kondo temperature (r -&gt; 0) is an infinite-U notion here: asked at finite U, a clear refusal.</summary>
    [Fact]
    public void Kondo_temperature_is_refused_at_finite_U()
    {
        var model = WithU(TestModels.LocalHybridization(LatticeKind.FlatDos, 1, 0.2, -0.5, 2, electrons: 2), 3);
        var ex = Assert.Throws<RequestError>(() => new SaddlePointSolver(model, new SolverSettings { Temperature = 0.01 }).DecoupledStability());
        Assert.Contains("infinite-U", ex.Message);
    }

    /// <summary>A Zeeman field breaks the paramagnetic four-boson ansatz: refused at bind time with file, line and field.</summary>
    [Fact]
    public void Zeeman_field_with_finite_U_names_the_zeeman_table()
    {
        var toml = ModelText.Valid.Replace("level = \"ef\"", "level = \"ef\"\nU = 300") + "\n[zeeman]\nfield = [0, 0, 5]\n";
        var e = ModelText.Error(toml);
        Assert.Equal("zeeman", e.Field);
        Assert.Equal(ModelText.LineOf(toml, "[zeeman]"), e.Line);
        Assert.Contains("paramagnetic", e.Message);
    }

    /// <summary>
    /// At infinite U a shell holds at most Q electrons, so 3.5 electrons do not fit a cell of one conduction orbital and
    /// one shell (2 + 1); at finite U the shell holds up to N = 2 (n_f is free in [0, 2]), so the count binds.
    /// </summary>
    [Fact]
    public void Finite_U_allows_up_to_N_electrons_per_shell()
    {
        var toml = ModelText.Valid.Replace("electrons_per_cell = 2", "electrons_per_cell = 3.5");
        Assert.Contains("infinite U", ModelText.Error(toml).Message);
        var model = ModelText.Bind(toml.Replace("level = \"ef\"", "level = \"ef\"\nU = 300"));
        Assert.Equal(3.5, model.ElectronsPerCell);
    }
}

/// <summary>
/// The chain-rule Jacobian of the finite-U residuals against Richardson-extrapolated central differences of the
/// residuals (the derivative's definition; Press et al., Numerical Recipes, 3rd ed. (2007), sec. 5.7), and Newton on the
/// symmetry wedge against Broyden on the full mesh: the same equations must give the same saddle point.
/// </summary>
public class FiniteUJacobianTests(ITestOutputHelper output)
{
    private static BoundModel Brelvanite() => ModelBinder.Bind(ModelFile.Load(Cli.CliRun.ModelPath("brelvanite.toml")), null);

    [Fact]
    public void Analytic_jacobian_matches_finite_differences()
    {
        var model = Brelvanite();
        var settings = new SolverSettings { Temperature = model.Solver!.Temperature ?? 1, Mesh = 8 };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        int g = sp.Groups.Count;
        var x = new double[3 * g];
        for (int i = 0; i < g; i++)
        {
            var b = sp.Groups[i].Bosons!.Value;
            x[i] = 1.04 * b.E; x[g + i] = 1.1 * b.D; x[2 * g + i] = sp.Groups[i].Lambda + 0.02 * Math.Abs(model.Shells[0].Level);
        }
        var (analytic, numeric) = new SaddlePointSolver(model, settings).JacobianCheck(x);
        Assert.NotNull(analytic);
        double scale = numeric.Max(Math.Abs), worst = 0;
        for (int i = 0; i < numeric.Length; i++) worst = Math.Max(worst, Math.Abs(analytic![i] - numeric[i]));
        output.WriteLine($"max |J| {scale:G4}, max |analytic - numeric| {worst:G3} ({worst / scale:G3} relative)");
        Assert.True(worst <= 1e-6 * scale, $"Jacobian off by {worst / scale:G3} relative");
    }

    [Fact]
    public void Newton_on_the_wedge_gives_the_Broyden_solution()
    {
        var model = Brelvanite();
        var settings = new SolverSettings { Temperature = model.Solver!.Temperature ?? 1, Mesh = 8, Tolerance = 1e-12 };
        var fast = new SaddlePointSolver(model, settings).Solve();
        var plain = new SaddlePointSolver(model, settings with { Symmetry = Meanfield.Symmetry.SymmetryRequest.None, AnalyticJacobian = false }).Solve();
        output.WriteLine($"Newton {fast.Iterations} iterations / {fast.ZonePasses} passes, Broyden {plain.Iterations} / {plain.ZonePasses}");
        Assert.True(fast.Converged && plain.Converged);
        for (int i = 0; i < fast.Groups.Count; i++)
        {
            Assert.Equal(plain.Groups[i].R, fast.Groups[i].R, 1e-8);
            Assert.Equal(plain.Groups[i].Bosons!.Value.D, fast.Groups[i].Bosons!.Value.D, 1e-8);
            Assert.Equal(plain.Groups[i].Lambda, fast.Groups[i].Lambda, 1e-8 * Math.Abs(model.Shells[0].Level));
        }
        Assert.Equal(plain.FreeEnergy, fast.FreeEnergy, 1e-8 * Math.Abs(model.Shells[0].Level));
    }
}
