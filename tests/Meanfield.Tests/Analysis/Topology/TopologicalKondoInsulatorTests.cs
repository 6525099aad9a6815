using Meanfield.Analysis.Topology;
using Meanfield.Bloch;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>
/// The shipped diamond model at zero staggering: its heavy bands at quarter filling form a topological Kondo insulator
/// (Dzero, Sun, Galitski &amp; Coleman, PRL 104, 106408 (2010)) whose class follows the sign of the [111] distortion as in
/// the bare Fu-Kane-Mele model (Fu, Kane &amp; Mele, PRL 98, 106803 (2007): dt &gt; 0 strong (1;111), dt &lt; 0 weak (0;111)).
/// </summary>
/// <remarks>
/// Why the heavy bands carry the conduction invariants (derived here; common practice in topological Kondo insulator
/// models): with on-site hybridization V r and the same (r, lambda) on both sites, every conduction eigenvector phi(k)
/// of energy eps gives the 2x2 problem [[eps, V r], [V r, eps_f~]] on (phi, 0), (0, phi); its lower root E_-(eps)
/// increases with eps and lies below eps_f~, which lies below every upper root. So the two lowest bands are
/// (alpha phi_1, beta phi_1) built on the lowest conduction Kramers pair, with alpha &gt; 0, and every Wilson-loop overlap
/// is (alpha alpha' + beta beta') &lt;phi|phi'&gt;: a positive factor times the conduction overlap, hence the same
/// Wannier centres and the same Z2.
/// </remarks>
public sealed class TopologicalKondoInsulatorTests
{
    private static RenormalizedHamiltonian Solve(double dt)
    {
        var overrides = new Dictionary<string, string> { ["m"] = "0", ["dt"] = dt.ToString(System.Globalization.CultureInfo.InvariantCulture) };
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")), overrides);
        var sp = new SaddlePointSolver(model, new SolverSettings { Temperature = model.Solver!.Temperature ?? 0, Mesh = 8 }).Solve();
        Assert.True(sp.Converged);
        Assert.Equal(SaddlePointBranch.Kondo, sp.Branch);
        return new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
    }

    [Theory]
    [InlineData(50.0, "(1;111)", Z2Class.Strong)]
    [InlineData(-50.0, "(0;111)", Z2Class.Weak)]
    public void HeavyBandsAtQuarterFillingFollowTheDistortionSign(double dt, string indices, Z2Class kind)
    {
        var h = Solve(dt);
        var r = Z2Invariants.Compute(h, 2, new Z2Options { GapMesh = 8, PumpSteps = 8, LoopPoints = 24 });
        Assert.Equal(InvariantStatus.Determined, r.Status);
        Assert.True(r.MethodsAgree, r.Reason);
        Assert.Equal(indices, r.Indices!.ToString());
        Assert.Equal(kind, r.Indices.Class);
        Assert.True(r.Gap!.IsInsulating);
    }

    // The phase label carries the class: the same solutions through the one digest every output reads.
    [Theory]
    [InlineData(50.0, "(1;111)", "strong-topological-kondo-insulator")]
    [InlineData(-50.0, "(0;111)", "weak-topological-kondo-insulator")]
    public void ThePhaseLabelNamesTheClass(double dt, string indices, string label)
    {
        var overrides = new Dictionary<string, string> { ["m"] = "0", ["dt"] = dt.ToString(System.Globalization.CultureInfo.InvariantCulture) };
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")), overrides);
        var settings = new SolverSettings { Temperature = model.Solver!.Temperature ?? 0, Mesh = 8 };
        var solution = Meanfield.Solutions.Solution.FromSaddlePoint(model, new SaddlePointSolver(model, settings).Solve(), settings);
        var digest = Meanfield.Analysis.SpectrumSummary.Compute(solution, new Meanfield.Analysis.SpectrumRequest { SearchMesh = 8, Dos = false, Heat = false });
        Assert.Equal(label, digest.Phase!.Name);
        Assert.Equal(indices, digest.Columns.Z2);
        Assert.Null(digest.Columns.ChernNumber);
        // Asked not to, the digest keeps the plain label: the class is never guessed.
        var plain = Meanfield.Analysis.SpectrumSummary.Compute(solution, new Meanfield.Analysis.SpectrumRequest { SearchMesh = 8, Dos = false, Heat = false, Topology = false });
        Assert.Equal("kondo-insulator", plain.Phase!.Name);
        Assert.Null(plain.Columns.Z2);
    }

    // 2D: the Kane-Mele model is quantum spin Hall for |M| < 3 sqrt(3) lambda and a normal insulator beyond (Kane & Mele,
    // PRL 95, 146802 (2005)); as a bare model at half filling its label follows.
    [Theory]
    [InlineData(0.0, "topological-kondo-insulator", "1")]
    [InlineData(1.3, "trivial-kondo-insulator", "0")]
    public void TwoDimensionalLabelsFollowTheKaneMeleBoundary(double mOverBoundary, string label, string z2)
    {
        const double lambda = 0.06;
        var h = TopologyModels.KaneMele(1, lambda, mOverBoundary * 3 * Math.Sqrt(3) * lambda);
        var solution = Meanfield.Solutions.Solution.Bare(h.Model, 12);
        var digest = Meanfield.Analysis.SpectrumSummary.Compute(solution, new Meanfield.Analysis.SpectrumRequest { SearchMesh = 12, Dos = false, Heat = false });
        Assert.Equal(label, digest.Phase!.Name);
        Assert.Equal(z2, digest.Columns.Z2);
    }

    // Without time reversal (a Zeeman field on the 3D model) there is no Z2 index: the label stays the plain one and
    // says why.
    [Fact]
    public void BrokenTimeReversalKeepsThePlainLabel()
    {
        var label = Meanfield.Analysis.PhaseClassifier.WithTopology(
            new Meanfield.Analysis.PhaseLabel(Meanfield.Analysis.Phase.KondoInsulator, "gapped"),
            Meanfield.Analysis.Topology.InvariantReport.Compute(AnalysisModelsField(), 2));
        Assert.Equal("kondo-insulator", label.Name);
        Assert.Contains("time reversal is broken", label.Reason);
    }

    private static BlochHamiltonian AnalysisModelsField()
    {
        var overrides = new Dictionary<string, string> { ["m"] = "0", ["dt"] = "50", ["hz"] = "3" };
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("topology/weyl-diamond-field.toml")), overrides);
        return new BlochHamiltonian(model);
    }
}
