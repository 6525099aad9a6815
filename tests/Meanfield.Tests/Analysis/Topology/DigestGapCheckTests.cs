using Meanfield.Analysis;
using Meanfield.Analysis.Topology;
using Meanfield.Models;
using Meanfield.Solutions;
using Meanfield.Solver;
using Meanfield.Tests.Cli;
using Meanfield.Units;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>
/// The digest hands its own node search to the invariants as their gap check: the answer must be the one a fresh
/// search gives, on a weakly inversion-broken diamond Kondo insulator (no parity formula: the Wannier-centre flow runs).
/// </summary>
public sealed class DigestGapCheckTests
{
    [Fact]
    public void TheDigestsSearchServesAsTheGapCheckOfTheFlow()
    {
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")), new Dictionary<string, string> { ["m"] = "50" });
        var settings = new SolverSettings { Temperature = 2 / model.Unit.Kelvins(), Mesh = 16, Shifted = true };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        var solution = Solution.FromSaddlePoint(model, sp, settings);
        var digest = SpectrumSummary.Compute(solution);
        var z2 = digest.Invariants!.Z2;
        // A small staggering keeps the gap of the dt > 0 diamond model open, so the class stays strong (1;111)
        // (Fu, Kane & Mele, PRL 98, 106803 (2007)); the flow, not the parity formula, decides it here.
        Assert.Equal("(1;111)", z2.Indices!.ToString());
        Assert.Null(z2.FromParity);
        var fresh = GapCheckResult.Run(solution.Hamiltonian, 2, Meanfield.Analysis.Nodes.NodeSearchOptions.DefaultMesh);
        Assert.Equal(fresh.Nodes, z2.Gap!.Nodes);
        Assert.Equal(fresh.IsInsulating, z2.Gap.IsInsulating);
        Assert.Equal(fresh.IndirectGap, z2.Gap.IndirectGap, 0.05 * Math.Abs(fresh.IndirectGap));
    }
}
