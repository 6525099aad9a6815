using Meanfield.Analysis;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis;

/// <summary>
/// The phase rule never gives a topological label to an unresolved node search: chiralities of all nodes must be
/// determined and sum to zero (Nielsen &amp; Ninomiya, Nucl. Phys. B 185, 20 (1981)) before "weyl-semimetal" is said.
/// </summary>
public class PhaseRuleTests
{
    private static readonly Lattice Cubic = Lattice.Create(LatticeKind.SimpleCubic, 1);
    private static readonly SpectrumTolerances Tol = SpectrumTolerances.For(-1, 1, 6, 4, Cubic, 0);
    private static readonly GapReport Gap = new(0, Vec3.Zero, 0, 0, Vec3.Zero, 0, Vec3.Zero, 1, "test");

    private static WeylNode Node(int? chirality, double offset) =>
        new(Vec3.Zero, Vec3.Zero, offset, offset, Math.Abs(offset) <= Tol.Pinning ? NodePinning.Pinned : offset > 0 ? NodePinning.Above : NodePinning.Below,
            0, chirality, chirality, 1e-3, new double[3, 3], [1, 1, 1], 1, Vec3.Zero, 0, 2, null, 0);

    private static NodeSearchResult Search(params WeylNode[] nodes)
    {
        bool resolved = nodes.All(n => n.Chirality is not null);
        return new(nodes, resolved ? nodes.Sum(n => n.Chirality!.Value) : null, 0, 0, false, false, 0, [], 1, 0, "test", Tol, 3);
    }

    [Fact]
    public void PinnedNodesWithCancellingChiralitiesAreAWeylSemimetal() =>
        Assert.Equal(Phase.WeylSemimetal, PhaseClassifier.Classify(false, true, Gap, Search(Node(1, 0), Node(-1, 0))).Phase);

    [Fact]
    public void AnUndeterminedChiralityIsUnresolved() =>
        Assert.Equal(Phase.Unresolved, PhaseClassifier.Classify(false, true, Gap, Search(Node(1, 0), Node(null, 0))).Phase);

    [Fact]
    public void ANonCancellingSumIsUnresolved() =>
        Assert.Equal(Phase.Unresolved, PhaseClassifier.Classify(false, true, Gap, Search(Node(1, 0), Node(1, 0))).Phase);

    [Fact]
    public void NodesOffMuGivePockets() =>
        Assert.Equal(Phase.WeylSemimetalWithPockets, PhaseClassifier.Classify(false, true, Gap, Search(Node(1, 0.01), Node(-1, -0.01))).Phase);

    [Fact]
    public void APartlyFilledBandIsAMetalWhateverTheNodes() =>
        Assert.Equal(Phase.HeavyMetal, PhaseClassifier.Classify(false, false, null, null).Phase);
}
