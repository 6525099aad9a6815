using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Analysis.Dos;

/// <summary>
/// Energies and orbital-kind weights are invariant under the operations of H(k) (common practice: E_n(gk) = E_n(k)
/// for every g of the group, and g maps conduction orbitals to conduction orbitals), so diagonalising only the
/// irreducible points and copying along each orbit must reproduce the full mesh to round-off.
/// </summary>
public sealed class WedgeSpectrumTests
{
    [Theory]
    [InlineData("weyl-diamond.toml", 10, false)]
    [InlineData("weyl-diamond.toml", 9, true)]
    [InlineData("kondo-insulator-sc.toml", 8, false)]
    [InlineData("heavy-metal-cubic.toml", 7, true)]
    [InlineData("honeycomb-2d.toml", 12, false)]
    public void WedgeEqualsFullMesh(string file, int n, bool shifted)
    {
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)));
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = model.Solver?.Temperature ?? 0.1, Mesh = 6 }).Solve();
        Assert.True(sp.Converged);
        var h = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        var mesh = new KMesh(model.Lattice, n, shifted);
        var wedge = SymmetryWedge.For(model, mesh);
        Assert.True(wedge.Mesh.Count < mesh.Count, "the test needs a nontrivial group");
        var full = MeshSpectrum.Compute(h, mesh, withProjections: true);
        var reduced = MeshSpectrum.Compute(h, wedge, withProjections: true);
        double scale = full.Energies.Max(Math.Abs);
        for (int i = 0; i < full.Energies.Length; i++)
            Assert.True(Math.Abs(full.Energies[i] - reduced.Energies[i]) <= 1e-12 * scale, $"energy {i}: {full.Energies[i]} vs {reduced.Energies[i]}");
        // Within a degenerate multiplet the split of weight among its bands depends on the eigenbasis chosen; the
        // multiplet's total (what every DOS sums) does not, so totals over multiplets are compared.
        int nb = full.Bands, nc = full.Channels;
        for (int k = 0; k < mesh.Count; k++)
            for (int start = 0; start < nb;)
            {
                int end = start + 1;
                while (end < nb && full.Energy(k, end) - full.Energy(k, end - 1) < 1e-8 * scale) end++;
                for (int c = 0; c < nc; c++)
                {
                    double a = 0, b = 0;
                    for (int m = start; m < end; m++) { a += full.Weights[(k * nb + m) * nc + c]; b += reduced.Weights[(k * nb + m) * nc + c]; }
                    Assert.True(Math.Abs(a - b) <= 1e-9, $"k {k}, bands {start}..{end - 1}, channel {c}: {a} vs {b}");
                }
                start = end;
            }
    }
}
