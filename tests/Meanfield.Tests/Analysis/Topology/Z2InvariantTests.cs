using Meanfield.Analysis.Symmetry;
using Meanfield.Analysis.Topology;
using Meanfield.Tests.Analysis;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>Z2 indices of the Fu-Kane-Mele diamond model by the parity formula and by the Wannier-centre flow.</summary>
public sealed class Z2InvariantTests
{
    private static readonly Z2Options Cheap = new() { GapMesh = 8, PumpSteps = 8, LoopPoints = 16 };

    /// <summary>
    /// Fu, Kane &amp; Mele, PRL 98, 106803 (2007): a distortion dt of the [111] bond gaps the Dirac points at X; dt &gt; 0
    /// gives the strong topological insulator (1;111), dt &lt; 0 the weak one (0;111) (their Fig. 2, from memory). The
    /// same follows from the parity formula (Fu &amp; Kane, PRB 76, 045302 (2007), Eq. 4.3 for this model): the
    /// spin-orbit term vanishes at the TRIM, so delta_i = -sign(sum_j t_j e^{i Gamma_i.(d_j - d_0)}) with
    /// d_j - d_0 = -a_j: Gamma 4t + dt, three L points 2t + dt, three X points dt, the [111] L point dt - 2t, hence
    /// (-1)^nu0 = -sign(dt) and (-1)^nu_k = -1 for every k.
    /// </summary>
    [Theory]
    [InlineData(0.4, 1, Z2Class.Strong)]
    [InlineData(-0.4, 0, Z2Class.Weak)]
    public void BondDistortionSignSelectsStrongOrWeak(double dt, int nu0, Z2Class kind)
    {
        var h = AnalysisModels.FuKaneMele(1, 0.125, dt);
        var r = Z2Invariants.Compute(h, 2, Cheap);
        Assert.Equal(InvariantStatus.Determined, r.Status);
        Assert.NotNull(r.FromParity);
        Assert.NotNull(r.FromFlow);
        Assert.True(r.MethodsAgree);
        Assert.Equal(nu0, r.Indices!.Nu0);
        Assert.Equal([1, 1, 1], r.Indices.Weak);
        Assert.Equal(kind, r.Indices.Class);
        // Parity by parity: delta = -sign(S) with S as derived above (t = 1).
        foreach (var trim in r.Trims)
        {
            var (n1, n2, n3) = trim.Index;
            double s = (1 + dt) + (n1 == 0 ? 1 : -1) + (n2 == 0 ? 1 : -1) + (n3 == 0 ? 1 : -1);
            Assert.Equal(-Math.Sign(s), trim.Delta);
        }
    }

    /// <summary>Fu, Kane &amp; Mele 2007: with equal bonds the bands touch at the three X points, so there is no invariant.</summary>
    [Fact]
    public void EqualBondsAreGapless()
    {
        var r = Z2Invariants.Compute(AnalysisModels.FuKaneMele(1, 0.125), 2, Cheap);
        Assert.Equal(InvariantStatus.Gapless, r.Status);
        Assert.Null(r.Indices);
    }

    /// <summary>
    /// Without inversion (staggered potential m, Murakami, New J. Phys. 9, 356 (2007)) only the flow applies; a small m
    /// does not close the gap, so the strong phase survives (an invariant changes only when the gap closes: common practice).
    /// </summary>
    [Fact]
    public void StaggeredPotentialLeavesOnlyTheFlowAndKeepsTheClass()
    {
        var r = Z2Invariants.Compute(AnalysisModels.FuKaneMele(1, 0.125, 0.4, 0.1), 2, Cheap);
        Assert.Equal(InvariantStatus.Determined, r.Status);
        Assert.Null(r.Inversion);
        Assert.Null(r.FromParity);
        Assert.Equal("(1;111)", r.Indices!.ToString());
    }

    /// <summary>
    /// Point groups of the diamond model (Fu, Kane &amp; Mele 2007; textbook crystallography): equal bonds O_h (48
    /// operations), a [111] distortion D_3d (12), a staggered potential T_d (24), both C_3v (6).
    /// </summary>
    [Theory]
    [InlineData(0.0, 0.0, 48, true)]
    [InlineData(0.4, 0.0, 12, true)]
    [InlineData(0.0, 0.1, 24, false)]
    [InlineData(0.4, 0.1, 6, false)]
    public void DiamondModelPointGroups(double dt, double m, int order, bool inversion)
    {
        var h = AnalysisModels.FuKaneMele(1, 0.125, dt, m);
        var ops = ModelSymmetry.Find(h);
        Assert.Equal(order, ops.Count);
        Assert.Equal(inversion, ops.Any(o => o.IsInversion));
        Assert.Equal(inversion, ModelSymmetry.FindInversion(h) is not null);
        Assert.True(ModelSymmetry.HasTimeReversal(h));
    }
}

/// <summary>The 2D Z2 index of the Kane-Mele model (Kane &amp; Mele, PRL 95, 146802 (2005)).</summary>
public sealed class TwoDimensionalZ2Tests
{
    private static readonly Z2Options Cheap = new() { GapMesh = 12, PumpSteps = 8, LoopPoints = 16 };
    private const double Lambda = 0.06;
    // Kane & Mele 2005: without Rashba coupling the quantum spin Hall phase is |M| < 3 sqrt(3) lambda.
    private static readonly double Boundary = 3 * Math.Sqrt(3) * Lambda;

    [Fact]
    public void InversionSymmetricKaneMeleIsQuantumSpinHallByBothMethods()
    {
        var r = Z2Invariants.Compute(TopologyModels.KaneMele(1, Lambda, 0), 2, Cheap);
        Assert.Equal(InvariantStatus.Determined, r.Status);
        Assert.NotNull(r.Inversion);
        Assert.True(r.MethodsAgree);
        Assert.Equal(1, r.Indices!.Nu0);
        Assert.Equal(Z2Class.Strong, r.Indices.Class);
    }

    [Theory]
    [InlineData(0.5, 1)]
    [InlineData(1.5, 0)]
    public void SublatticePotentialBeyondThePublishedBoundaryMakesItTrivial(double mOverBoundary, int nu)
    {
        var r = Z2Invariants.Compute(TopologyModels.KaneMele(1, Lambda, mOverBoundary * Boundary), 2, Cheap);
        Assert.Equal(InvariantStatus.Determined, r.Status);
        Assert.Null(r.Inversion);
        Assert.Equal(nu, r.Indices!.Nu0);
    }
}
