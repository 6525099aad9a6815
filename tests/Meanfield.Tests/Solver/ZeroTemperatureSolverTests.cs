using System.Numerics;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Numerics;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Tests.Models;
using Meanfield.Tests.Support;
using Xunit.Abstractions;

namespace Meanfield.Tests.Solver;

/// <summary>The saddle point at T = 0 on k-meshes, with tetrahedron occupations (metals, insulators, semimetals).</summary>
public class ZeroTemperatureSolverTests(ITestOutputHelper output)
{
    private static SaddlePoint Solve(Meanfield.Binding.BoundModel model, double t, int mesh, out SaddlePointSolver solver)
    {
        solver = new SaddlePointSolver(model, new SolverSettings { Temperature = t, Mesh = mesh });
        var sp = solver.Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        return sp;
    }

    /// <summary>Eigenvalues of the renormalized H(k) at a Cartesian k.</summary>
    private static double[] Bands(SaddlePointSolver solver, SaddlePoint sp, Vec3 k)
    {
        int n = solver.Bare.Size;
        var ham = new RenormalizedHamiltonian(solver.Bare, sp.Amplitudes);
        var h = new Complex[n * n]; var s = new Complex[n * n]; var e = new double[n];
        ham.Assemble(k, h, s);
        Eigensolvers.Create(n).Solve(h, e, Span<Complex>.Empty);
        return e;
    }

    /// <summary>
    /// A metal at T = 0 converges with tetrahedron weights, and its z = r^2 is the T -&gt; 0 limit of the Fermi-Dirac
    /// solutions: a Fermi liquid's corrections start at T^2 (Sommerfeld expansion; Ashcroft &amp; Mermin, Solid State
    /// Physics (1976), ch. 2), so z(0) ~ z(T) + (z(T) - z(2T)) / 3. At 16^3 the thermal points are within 2e-5 of their
    /// mesh limit (k_B T above the level spacing; measured against 32^3); the budget is the T = 0 mesh error at 16^3
    /// (~1e-4 in z, it shrinks from 12^3) plus the T^4 remainder of the extrapolation (~3e-5). The T = 0 value must
    /// also beat the lowest-temperature point itself.
    /// </summary>
    [Fact]
    public void MetalAtZeroTemperatureIsTheLowTemperatureLimit()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons: 1.6);
        var coarse = Solve(model, 0, 12, out _).Groups[0].Z;
        var sp = Solve(model, 0, 16, out var solver);
        Assert.Contains("tetrahedron", sp.Sampling);
        Assert.Equal(FermiLevelStatus.Regular, sp.FermiLevel);
        Assert.NotNull(sp.FermiWindow);
        Assert.Equal(0.0, sp.FermiWindow!.Value.Width);
        Assert.True(sp.ZonePasses < 30, $"{sp.ZonePasses} zone passes");
        double z0 = sp.Groups[0].Z;
        double z1 = Solve(model, 1.0, 16, out _).Groups[0].Z, z2 = Solve(model, 2.0, 16, out _).Groups[0].Z;
        double limit = z1 + (z1 - z2) / 3;
        output.WriteLine($"z(T=0): {coarse:R} (12^3), {z0:R} (16^3); z(1) {z1:R}, z(2) {z2:R}; extrapolated {limit:R}");
        Assert.True(Math.Abs(z0 - limit) < 2e-4, $"T = 0 z {z0} vs extrapolated {limit}");
        Assert.True(Math.Abs(z0 - limit) < Math.Abs(z1 - limit), "the T = 0 solution is farther from the limit than T = 1");
        Assert.True(Math.Abs(z0 - limit) < Math.Abs(coarse - limit), "refining the mesh did not approach the limit");
    }

    /// <summary>The shipped heavy-metal demo (a Fermi-liquid metal) converges at T = 0; it used to be refused there.</summary>
    [Fact]
    public void ShippedHeavyMetalConvergesAtZeroTemperature()
    {
        var path = Path.Combine(ModelText.RepositoryRoot(), "models", "heavy-metal-cubic.toml");
        var model = ModelBinder.Bind(ModelFile.Load(path));
        var sp = Solve(model, 0, 10, out _);
        output.WriteLine($"r {sp.Groups[0].R:R}, mu {sp.Mu:R}, {sp.ZonePasses} passes");
        Assert.Equal(SaddlePointBranch.Kondo, sp.Branch);
        Assert.Equal(0.0, sp.FermiWindow!.Value.Width);
        Assert.Empty(sp.Notes);
    }

    /// <summary>
    /// Kondo insulator at T = 0 (N_e = 2, the lower hybridized bands full; Oshikawa, PRL 84, 3370 (2000) for the count,
    /// the even-count rule is common practice): the window is the gap of the interpolated bands, i.e. from the highest
    /// band-2 energy to the lowest band-3 energy on the mesh, and mu is its middle.
    /// </summary>
    [Fact]
    public void KondoInsulatorWindowIsTheMeshGap()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -250, 2, electrons: 2);
        var sp = Solve(model, 0, 8, out var solver);
        var mesh = ((MeshStateSum)solver.StateSum).Mesh;
        double top = double.NegativeInfinity, bottom = double.PositiveInfinity;
        for (int k = 0; k < mesh.Count; k++)
        {
            var e = Bands(solver, sp, mesh.Cartesian(k));
            top = Math.Max(top, e[1]); bottom = Math.Min(bottom, e[2]);
        }
        var w = sp.FermiWindow!.Value;
        output.WriteLine($"window [{w.Lower:R}, {w.Upper:R}], mesh gap [{top:R}, {bottom:R}], mu {sp.Mu:R}");
        double scale = 1e-9 * Math.Abs(bottom - top);
        Assert.Equal(top, w.Lower, scale);
        Assert.Equal(bottom, w.Upper, scale);
        Assert.Equal(w.Middle, sp.Mu, scale);
    }

    /// <summary>
    /// Ideal semimetal: the shipped diamond model with dt = 0 and m = 60 at T = 0 has its touchings of bands 2 and 3
    /// (N_e = 2) on the X-W lines (issue statement; the X-W line is where the Fu-Kane-Mele d-vector decouples, Murakami,
    /// New J. Phys. 9, 356 (2007)). The electron count puts mu at the node energy (common practice), so the tetrahedron
    /// window must contain it wherever the mesh points fall. The node is found here by minimising the gap on X-W.
    /// </summary>
    [Fact]
    public void SemimetalWindowContainsTheNodeEnergy()
    {
        var path = Path.Combine(ModelText.RepositoryRoot(), "models", "weyl-diamond.toml");
        var model = ModelBinder.Bind(ModelFile.Load(path), new Dictionary<string, string> { ["dt"] = "0", ["m"] = "60" });
        var sp = Solve(model, 0, 12, out var solver);
        double g = 2 * Math.PI / model.Lattice.Constant;
        Vec3 X = new(g, 0, 0), W = new(g, 0.5 * g, 0);
        double Gap(double s) { var e = Bands(solver, sp, X + s * (W - X)); return e[2] - e[1]; }
        // Coarse scan, then golden section on the bracketing interval (the gap is |linear| near a node).
        int best = 0; double bestGap = double.PositiveInfinity;
        for (int i = 0; i <= 200; i++) { double v = Gap(i / 200.0); if (v < bestGap) { bestGap = v; best = i; } }
        double a = Math.Max(0, (best - 1) / 200.0), b = Math.Min(1, (best + 1) / 200.0), phi = (Math.Sqrt(5) - 1) / 2;
        for (int it = 0; it < 80; it++)
        {
            double c = b - phi * (b - a), d = a + phi * (b - a);
            if (Gap(c) < Gap(d)) b = d; else a = c;
        }
        double sNode = 0.5 * (a + b);
        var node = Bands(solver, sp, X + sNode * (W - X));
        double eNode = 0.5 * (node[1] + node[2]), width = node[3] - node[0];
        var w = sp.FermiWindow!.Value;
        output.WriteLine($"node at s = {sNode:R}, gap {node[2] - node[1]:G3}, E_node {eNode:R}; window [{w.Lower:R}, {w.Upper:R}], mu {sp.Mu:R}");
        Assert.True(node[2] - node[1] < 1e-6 * width, $"no touching on X-W: smallest gap {node[2] - node[1]}");
        Assert.True(w.Width > 0, "the interpolated bands overlap: not an ideal semimetal on this mesh");
        Assert.True(w.Contains(eNode), $"E_node {eNode} outside the window [{w.Lower}, {w.Upper}]");
    }
}
