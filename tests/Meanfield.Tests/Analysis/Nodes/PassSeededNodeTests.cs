using Meanfield.Analysis;
using Meanfield.Analysis.Nodes;
using Meanfield.Bloch;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Solutions;
using Meanfield.Solver;
using Meanfield.Tests.Cli;
using Meanfield.Units;

namespace Meanfield.Tests.Analysis.Nodes;

/// <summary>
/// The node search seeded from a solve's final pass (its mesh and symmetry group: one minimum per orbit, orbits
/// completed by the group, chiralities carried by the operations' parity) against the search on its own coarse mesh
/// with the lattice's operations and a flux on every node.
/// </summary>
public class PassSeededNodeTests
{
    [Theory]
    [InlineData(16, 3.0, new[] { "dt", "0.2*t", "m", "200" })]
    [InlineData(18, 2.0, new[] { "dt", "0", "m", "60" })]
    public void SeededFromThePassTheSameNodesComeBack(int mesh, double kelvin, string[] sets)
    {
        var overrides = new Dictionary<string, string>();
        for (int i = 0; i < sets.Length; i += 2) overrides[sets[i]] = sets[i + 1];
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")), overrides);
        var settings = new SolverSettings { Temperature = kelvin / model.Unit.Kelvins(), Mesh = mesh, Shifted = true };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        Assert.NotNull(sp.FinalPass);
        Assert.True(sp.FinalPass!.Wedge.Group.Order > 1, "the test needs a symmetry group");
        var h = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        var options = new NodeSearchOptions { Temperature = settings.Temperature };
        var plain = NodeSearch.Find(h, 2, sp.Mu, options);
        var seeded = NodeSearch.Find(h, 2, sp.Mu, options, sp.FinalPass);
        Assert.Equal(sp.FinalPass.Wedge.Mesh.ToString(), seeded.Mesh);
        Assert.NotEmpty(plain.Nodes);
        Assert.Equal(plain.Nodes.Count, seeded.Nodes.Count);
        // Nielsen & Ninomiya, Nucl. Phys. B 185, 20 (1981): the chiralities over the zone sum to zero.
        Assert.Equal(0, seeded.ChiralitySum);
        foreach (var n in plain.Nodes)
        {
            var twin = seeded.Nodes.MinBy(s => NodeSearch.PeriodicDistance(model.Lattice, s.Cartesian, n.Cartesian))!;
            double d = NodeSearch.PeriodicDistance(model.Lattice, twin.Cartesian, n.Cartesian) / SpectrumTolerances.ShortestReciprocal(model.Lattice);
            Assert.True(d < 1e-7, $"node {n.Reduced}: nearest seeded node {twin.Reduced} is {d:G3} |b| away");
            Assert.Equal(n.Chirality, twin.Chirality);
            Assert.Equal(n.Pinning, twin.Pinning);
            Assert.Equal(n.Energy, twin.Energy, 1e-7 * seeded.Tolerances.PairWidth);
        }
        // Nodes of one orbit are exact images: one energy to round-off.
        foreach (var orbit in seeded.Nodes.GroupBy(x => x.Orbit))
            Assert.True(orbit.Max(x => x.Energy) - orbit.Min(x => x.Energy) < 1e3 * seeded.Tolerances.NumericalFloor);
    }

    [Fact]
    public void ReadAtAnotherMuOnlyTheOffsetsMove()
    {
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")));
        var settings = new SolverSettings { Temperature = model.Solver!.Temperature ?? 0, Mesh = 16, Shifted = true };
        var sp = new SaddlePointSolver(model, settings).Solve();
        var h = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        var at = NodeSearch.Find(h, 2, sp.Mu, new NodeSearchOptions { Temperature = settings.Temperature }, sp.FinalPass);
        double shift = 10 * at.Tolerances.Pinning;
        var moved = at.At(sp.Mu + shift);
        var again = NodeSearch.Find(h, 2, sp.Mu + shift, new NodeSearchOptions { Temperature = settings.Temperature }, sp.FinalPass);
        Assert.Equal(again.Nodes.Count, moved.Nodes.Count);
        for (int i = 0; i < moved.Nodes.Count; i++)
        {
            Assert.Equal(again.Nodes[i].EnergyOffset, moved.Nodes[i].EnergyOffset, 1e-9 * at.Tolerances.PairWidth);
            Assert.Equal(again.Nodes[i].Pinning, moved.Nodes[i].Pinning);
            Assert.Equal(at.Nodes[i].EnergyOffset - shift, moved.Nodes[i].EnergyOffset, 1e-9 * at.Tolerances.PairWidth);
        }
        Assert.All(moved.Nodes, n => Assert.NotEqual(NodePinning.Pinned, n.Pinning));
    }
}
