using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Numerics;
using Meanfield.Output;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Output;

/// <summary>
/// Round trip of the renormalized model through the real-space hopping table: the reloaded table, Fourier-summed with
/// phases e^{ik.R} (convention I), must give the same eigenvalues as the mean-field Hamiltonian (convention II) — the
/// two conventions differ by the unitary diag(e^{ik.tau}), which leaves the spectrum unchanged (common practice).
/// </summary>
public class HoppingTableTests
{
    [Theory]
    [InlineData("weyl-diamond.toml")]
    [InlineData("kondo-insulator-sc.toml")]
    public void ReloadedTableReproducesRenormalizedBands(string file)
    {
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)));
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = 1.0, Mesh = 6 }).Solve();
        Assert.True(sp.Converged);
        var renormalized = RenormalizedModel.Build(model, sp.Amplitudes);
        var path = Path.Combine(CliRun.TempDir(), "table.dat");
        HoppingTable.FromModel(renormalized, "round trip").Save(path);
        var table = HoppingTable.Load(path);

        int n = model.BasisSize;
        var mf = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        var h = new Complex[n * n]; var s = new Complex[n * n]; var e1 = new double[n]; var e2 = new double[n];
        var eig = Eigensolvers.Create(n);
        var rng = new Random(7);
        for (int trial = 0; trial < 20; trial++)
        {
            var k = model.Lattice.Cartesian(rng.NextDouble(), rng.NextDouble(), rng.NextDouble());
            mf.Assemble(k, h, s);
            eig.Solve(h, e1, Span<Complex>.Empty);
            table.Assemble(model.Lattice, k, h);
            eig.Solve(h, e2, Span<Complex>.Empty);
            for (int b = 0; b < n; b++) Assert.Equal(e1[b], e2[b], 1e-10);
        }
    }

    [Fact]
    public void MalformedTableNamesTheLine()
    {
        var path = Path.Combine(CliRun.TempDir(), "bad.dat");
        File.WriteAllText(path, "comment\n2\n1\n1\n0 0 0 1 1 1.0 0.0\n0 0 0 2 1 x 0.0\n");
        var e = Assert.Throws<InvalidDataException>(() => HoppingTable.Load(path));
        Assert.Contains("bad.dat:6", e.Message);
    }
}
