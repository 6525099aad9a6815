using Meanfield.Analysis.Surfaces;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Surfaces;

/// <summary>
/// Bulk-boundary correspondence of a Weyl semimetal (Wan, Turner, Vishwanath &amp; Savrasov, PRB 83, 205101 (2011)):
/// along a closed loop in the surface zone the surface states cross the node energy a net number of times equal to the
/// net chirality of the nodes projected inside. Model: t [sin kx sx + sin ky sy + (cos kz - cos k0 + 2 - cos kx -
/// cos ky) sz], nodes at (0, 0, +-k0), face (100).
/// <para>
/// Sign, derived for this model: on the half chain x &lt;= 0 the end state at E = 0 is psi_j = M^-j chi_+ with
/// sy chi_+ = +chi_+ and M = 1 + cos kz - cos k0 - (1 - cos ky) (it needs |M| &lt; 1, i.e. |kz| &gt; k0 near ky = 0), so
/// the top-face arc is E = t sin ky for |kz| &gt; k0. A loop walked counter-clockwise seen from outside (+x; axes
/// e1 = y, e2 = z up to a rotation) around the node at +k0 meets the arc at its top, moving towards -ky: one downward
/// crossing. That node is H = qx sx + qy sy - qz sz, chirality sign det v = -1 in the convention of
/// <see cref="Meanfield.Analysis.Nodes.SphereChirality"/>. So net crossings (up - down) = net chirality inside, with no
/// sign left to choose.
/// </para>
/// </summary>
public sealed class BulkBoundaryTests
{
    private const double K0 = Math.PI / 2;

    private static (Slab Slab, IReadOnlyList<ProjectedNode> Nodes) Setup(int mirror)
    {
        var bulk = SurfaceModels.Weyl(1, K0, mirror);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 1, 0, 0));
        var (nodes, note) = ProjectedNodes.Find(bulk, cut.Zone, 0.0, 8);
        Assert.Null(note);
        return (new Slab(cut, 16), nodes);
    }

    [Theory]
    [InlineData(1)]
    [InlineData(-1)]
    public void Net_crossings_around_a_projected_node_equal_its_chirality(int mirror)
    {
        var (slab, nodes) = Setup(mirror);
        Assert.Equal(2, nodes.Count);
        Assert.Equal(0, nodes.Sum(n => n.Chirality));
        foreach (var node in nodes)
        {
            Assert.Equal(K0, node.KPar.Norm, 6);
            Assert.Equal(1, Math.Abs(node.Chirality));
            var loop = SurfaceStateCounting.Circle(slab.Cut.Zone, node.KPar, 0.8, 48);
            var c = SurfaceStateCounting.CountAlongLoop(slab, loop, 0.0, 0.4, 5);
            Assert.Equal(0, c.Ambiguous);
            Assert.Equal(node.Chirality, c.Net);
            Assert.Equal(1, c.Up + c.Down);
        }
    }

    [Fact]
    public void Loops_around_both_nodes_or_none_count_zero()
    {
        var (slab, nodes) = Setup(1);
        var zone = slab.Cut.Zone;
        var both = SurfaceStateCounting.CountAlongLoop(slab, SurfaceStateCounting.Circle(zone, Vec3.Zero, 2.4, 96), 0.0, 0.4, 5);
        Assert.Equal(0, both.Ambiguous);
        Assert.Equal(0, both.Net);
        var away = 0.5 * zone.B1;   // a zone-boundary point far from both projections
        var none = SurfaceStateCounting.CountAlongLoop(slab, SurfaceStateCounting.Circle(zone, away, 0.8, 48), 0.0, 0.4, 5);
        Assert.Equal(0, none.Net);
    }
}
