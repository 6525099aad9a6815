using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Tests.Support;
using Xunit.Abstractions;

namespace Meanfield.Tests.Solver;

public class LatticeSolverTests(ITestOutputHelper output)
{
    private static SaddlePoint Solve(Meanfield.Binding.BoundModel model, double t, int mesh, out SaddlePointSolver solver)
    {
        solver = new SaddlePointSolver(model, new SolverSettings { Temperature = t, Mesh = mesh });
        var sp = solver.Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        return sp;
    }

    /// <summary>
    /// Kondo insulator: at N_e = 2 per cell (even) the lower hybridized bands are full, mu sits inside the indirect gap
    /// and the occupied states count exactly N_e per cell (Luttinger count with a gapped spectrum; Oshikawa, PRL 84,
    /// 3370 (2000); the even-count rule is common practice).
    /// </summary>
    [Fact]
    public void KondoInsulatorPutsMuInsideTheGap()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -250, 2, electrons: 2);
        var sp = Solve(model, 0, 10, out var solver);
        var ham = new RenormalizedHamiltonian(solver.Bare, sp.Amplitudes);
        var mesh = new KMesh(model.Lattice, 10, shifted: true);
        double top = double.NegativeInfinity, bottom = double.PositiveInfinity;
        int below = 0;
        var h = new Complex[16]; var s = new Complex[16]; var e = new double[4];
        var eig = Eigensolvers.Create(4);
        for (int k = 0; k < mesh.Count; k++)
        {
            ham.Assemble(mesh.Cartesian(k), h, s);
            eig.Solve(h, e, Span<Complex>.Empty);
            top = Math.Max(top, e[1]); bottom = Math.Min(bottom, e[2]);
            foreach (var v in e) if (v < sp.Mu) below++;
        }
        output.WriteLine($"valence top {top:G8}, conduction bottom {bottom:G8}, mu {sp.Mu:G8}");
        Assert.True(top < sp.Mu && sp.Mu < bottom, $"mu {sp.Mu} outside the gap [{top}, {bottom}]");
        Assert.Equal(2 * mesh.Count, below);
        Assert.InRange(sp.Groups[0].FOccupation, 0.5, 1.0); // n_f = Q - r^2 < Q
        Assert.Equal(1.0, sp.Groups[0].FOccupation + sp.Groups[0].Z, 1e-9);
    }

    /// <summary>Stationarity of F in r and lambda at a lattice solution (Newns &amp; Read, Adv. Phys. 36, 799 (1987)).</summary>
    [Fact]
    public void LatticeFreeEnergyIsStationary()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons: 1.7);
        var sp = Solve(model, 5.0, 8, out var solver);
        var x = sp.Amplitudes.Pack();
        for (int i = 0; i < x.Length; i++)
        {
            double h = 1e-4 * Math.Max(1, Math.Abs(x[i]));
            var xp = (double[])x.Clone(); xp[i] += h;
            var xm = (double[])x.Clone(); xm[i] -= h;
            double grad = (solver.FreeEnergyAt(MeanFieldAmplitudes.Unpack(xp)) - solver.FreeEnergyAt(MeanFieldAmplitudes.Unpack(xm))) / (2 * h);
            output.WriteLine($"dF/dx[{i}] = {grad:G3}");
            Assert.True(Math.Abs(grad) < 1e-5, $"dF/dx[{i}] = {grad}");
        }
    }

    /// <summary>Sites related by symmetry converge to equal r; a staggered potential breaks the symmetry (common practice).</summary>
    [Fact]
    public void EquivalentSitesShareRAndStaggeringSplitsIt()
    {
        var even = Solve(TestModels.TwoSublattice(100, 150, -200, 0, 4), 2.0, 8, out _);
        output.WriteLine($"m = 0: r_A {even.Groups[0].R:R}, r_B {even.Groups[1].R:R}");
        Assert.Equal(even.Groups[0].R, even.Groups[1].R, 1e-8);
        var staggered = Solve(TestModels.TwoSublattice(100, 150, -200, 120, 4), 2.0, 8, out _);
        output.WriteLine($"m = 120: r_A {staggered.Groups[0].R:R}, r_B {staggered.Groups[1].R:R}");
        Assert.True(Math.Abs(staggered.Groups[0].R - staggered.Groups[1].R) > 1e-3);
    }

    /// <summary>
    /// k-mesh convergence: successive differences of z = r^2 shrink as the mesh grows, for an insulator and a metal
    /// (the trend is asserted, the numbers are printed). Convergence of Brillouin-zone sums: common practice.
    /// </summary>
    [Theory]
    [InlineData(2.0, 0.0)]
    [InlineData(1.6, 5.0)]
    public void MeshConvergenceTrend(double electrons, double temperature)
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons);
        int[] meshes = [6, 10, 14, 18];
        var z = meshes.Select(n => Solve(model, temperature, n, out _).Groups[0].Z).ToArray();
        output.WriteLine($"N_e = {electrons}, T = {temperature}: z = {string.Join(", ", meshes.Zip(z, (n, v) => $"{n}: {v:G8}"))}");
        double first = Math.Abs(z[1] - z[0]), last = Math.Abs(z[3] - z[2]);
        Assert.True(last < first, $"differences did not shrink: {first} -> {last}");
    }

    [Fact]
    public void ImpossibleInputIsRefused()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons: 4.5);
        var e1 = Assert.Throws<RequestError>(() => new SaddlePointSolver(model, new SolverSettings()));
        Assert.Contains("impossible", e1.Message);
        var badQ = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons: 2, q: 2.0);
        Assert.Contains("cannot be met", Assert.Throws<RequestError>(() => new SaddlePointSolver(badQ, new SolverSettings())).Message);
        var ok = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons: 2);
        Assert.Contains("temperature", Assert.Throws<RequestError>(() => new SaddlePointSolver(ok, new SolverSettings { Temperature = -1 })).Message);
        Assert.Contains("mesh", Assert.Throws<RequestError>(() => new SaddlePointSolver(ok, new SolverSettings { Mesh = 1 })).Message);
    }

    [Fact]
    public void IterationCapIsReportedNotHidden()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, 100, 150, -200, 2, electrons: 1.7);
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = 5, Mesh = 6, MaxIterations = 1 }).Solve();
        Assert.False(sp.Converged);
        Assert.Contains(sp.Notes, n => n.Contains("iteration cap"));
    }
}
