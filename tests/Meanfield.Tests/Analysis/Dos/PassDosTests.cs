using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Symmetry;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Analysis.Dos;

/// <summary>
/// The DOS at one energy from a pass over the irreducible wedge (<see cref="PassDos"/>) against the tetrahedron DOS of
/// the full mesh and against the analytic simple-cubic value.
/// </summary>
public class PassDosTests
{
    [Fact]
    public void SimpleCubicCentreFromTheWedgeMatchesWatsonAndTheFullMesh()
    {
        const double t = 0.5;
        var h = AnalysisModels.SimpleCubic(t);
        var mesh = new KMesh(Lattice.Create(LatticeKind.SimpleCubic, 1.0), 32);
        var wedge = new IrreducibleMesh(mesh, SymmetryGroup.Find(h));
        Assert.True(wedge.Count * 8 < mesh.Count, "the test needs a large reduction");
        var reduced = PassDos.AtEnergy(PassDos.Diagonalise(h, wedge), 0);
        // rho(0) = W_fcc / (pi t) = 0.1426729827 / t (Watson, Q. J. Math. 10, 266 (1939); Glasser & Zucker, PNAS 74, 1800 (1977)).
        Assert.InRange(reduced.Total * t, 0.1426729827 * 0.99, 0.1426729827 * 1.01);
        var full = new TetrahedronDos(h, mesh).DosAtEnergy(0);
        Assert.Equal(full.Total, reduced.Total, 1e-12 * full.Total);
        Assert.Equal(0.0, reduced.Correlated);
    }

    [Theory]
    [InlineData("heavy-metal-cubic.toml", 9, true)]
    [InlineData("weyl-diamond.toml", 8, false)]
    [InlineData("honeycomb-2d.toml", 12, false)]
    public void TheSolversFinalPassGivesTheFullMeshDosAtMu(string file, int n, bool shifted)
    {
        // Energies and kind weights are invariant along an orbit of H(k)'s operations (common practice), so the solver's
        // wedge pass must give the tetrahedron DOS of the full mesh to round-off, correlated part included.
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)));
        var settings = new SolverSettings { Temperature = model.Solver?.Temperature ?? 0.1, Mesh = n, Shifted = shifted };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        var pass = sp.FinalPass;
        Assert.NotNull(pass);
        Assert.True(pass!.MadeAt(sp.Amplitudes));
        var h = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        var full = new TetrahedronDos(h, new KMesh(model.Lattice, n, shifted)).DosAtEnergy(sp.Mu);
        // A probe inside the bands, so the comparison is not between two zeros.
        double probe = sp.Mu + 0.05 * (pass.Energies.Max() - pass.Energies.Min());
        var fullProbe = new TetrahedronDos(h, new KMesh(model.Lattice, n, shifted)).DosAtEnergy(probe);
        foreach (var (energy, expected) in new[] { (sp.Mu, full), (probe, fullProbe) })
        {
            var fromPass = Meanfield.Analysis.Dos.PassDos.AtEnergy(pass, energy);
            double scale = Math.Max(expected.Total, 1e-300);
            Assert.True(Math.Abs(expected.Total - fromPass.Total) <= 1e-9 * scale, $"{file} total at {energy}: {expected.Total} vs {fromPass.Total}");
            Assert.True(Math.Abs(expected.Correlated - fromPass.Correlated) <= 1e-9 * scale, $"{file} correlated at {energy}: {expected.Correlated} vs {fromPass.Correlated}");
        }
        Assert.True(fullProbe.Total > 0, "the probe must lie inside the bands");
    }

    [Fact]
    public void GapsFromTheWedgePassAreThoseOfTheFullMesh()
    {
        // Band extrema are the same across an orbit (common practice), and the wedge keeps each orbit's smallest index,
        // so the extrema and where they are first met agree with a scan of the whole mesh.
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")), new Dictionary<string, string> { ["m"] = "50" });
        var settings = new SolverSettings { Temperature = 0.2, Mesh = 10, Shifted = true };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        var h = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        var full = Meanfield.Analysis.Gaps.GapFinder.Find(h, new KMesh(model.Lattice, 10, true), 2);
        var reduced = Meanfield.Analysis.Gaps.GapFinder.Find(sp.FinalPass!, 2);
        Assert.True(reduced.Indirect > 0, "the test needs an insulator");
        Assert.Equal(full.Direct, reduced.Direct, 1e-9 * Math.Abs(full.Direct));
        Assert.Equal(full.Indirect, reduced.Indirect, 1e-9 * Math.Abs(full.Indirect));
        Assert.Equal(full.ValenceMaximum, reduced.ValenceMaximum, 1e-12 * Math.Abs(full.ValenceMaximum));
        Assert.Equal(full.ConductionMinimum, reduced.ConductionMinimum, 1e-12 * Math.Abs(full.ConductionMinimum));
    }
}
