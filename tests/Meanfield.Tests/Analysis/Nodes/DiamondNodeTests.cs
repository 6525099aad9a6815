using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Nodes;

public class DiamondNodeTests
{
    [Theory]
    [InlineData(0.05)]
    [InlineData(0.15)]
    public void FuKaneMeleModelHasFourfoldNodesAtTheThreeXPoints(double lambda)
    {
        // Fu, Kane & Mele, PRL 98, 106803 (2007): with nearest-neighbour hopping and spin-orbit only, the bands touch
        // at E = 0 (fourfold, Dirac) at the three X points for any lambda.
        var r = NodeSearch.Find(AnalysisModels.FuKaneMele(1.0, lambda), occupied: 2, chemicalPotential: 0,
                                new NodeSearchOptions { Mesh = 12 });
        Assert.Equal(3, r.Nodes.Count);
        foreach (var n in r.Nodes)
        {
            Assert.Equal("X", n.Location);
            Assert.Equal(4, n.Degeneracy);
            Assert.Equal(0, n.Chirality);
            Assert.Equal(0, n.EnergyOffset, 9);
        }
        Assert.Equal(0, r.ChiralitySum);
    }

    [Fact]
    public void BondDistortionOpensGapTwiceDtAtX()
    {
        // Fu, Kane & Mele, PRL 98, 106803 (2007): a distortion dt on the [111] bond gives E(X) = +-|dt|.
        const double dt = 0.3;
        var src = AnalysisModels.FuKaneMele(1.0, 0.125, dt);
        var ws = new BlochWorkspace(src);
        var a = src.Model.Lattice.Constant;
        foreach (var x in new[] { new Vec3(2 * Math.PI / a, 0, 0), new Vec3(0, 2 * Math.PI / a, 0), new Vec3(0, 0, 2 * Math.PI / a) })
        {
            ws.Solve(x, false);
            Assert.Equal(-dt, ws.Values[1], 10);
            Assert.Equal(dt, ws.Values[2], 10);
        }
    }

    [Fact]
    public void StaggeredPotentialWindowHoldsWeylNodesSummingToZero()
    {
        // Murakami, New J. Phys. 9, 356 (2007); Murakami & Kuga, PRB 78, 165313 (2008): with inversion broken by a
        // staggered potential m between the two insulating phases a Weyl phase opens. For t = 1, lambda = 0.125,
        // dt = 0.3 we found it numerically at about 0.68 < m < 1.0 (12 nodes, C3v x time reversal). Time reversal maps
        // a node at k to one at -k with the same chirality (standard).
        var inside = NodeSearch.Find(AnalysisModels.FuKaneMele(1.0, 0.125, 0.3, 0.8), 2, 0, new NodeSearchOptions { Mesh = 16 });
        Assert.Equal(12, inside.Nodes.Count);
        Assert.Equal(0, inside.ChiralitySum);
        Assert.Equal(6, inside.Nodes.Count(n => n.Chirality == 1));
        Assert.Equal(6, inside.Nodes.Count(n => n.Chirality == -1));
        var lattice = AnalysisModels.FuKaneMele(1.0, 0.125).Model.Lattice;
        foreach (var n in inside.Nodes)
        {
            Assert.Equal(2, n.Degeneracy);
            var partner = inside.Nodes.Single(p => NodeSearch.PeriodicDistance(lattice, p.Cartesian, -n.Cartesian) < 1e-5);
            Assert.Equal(n.Chirality, partner.Chirality);
        }
        foreach (double m in new[] { 0.4, 1.4 })
            Assert.Empty(NodeSearch.Find(AnalysisModels.FuKaneMele(1.0, 0.125, 0.3, m), 2, 0, new NodeSearchOptions { Mesh = 12 }).Nodes);
    }

    [Fact]
    public void HighSymmetryLocatorNamesFccPointsAndLines()
    {
        // Setyawan & Curtarolo, Comput. Mater. Sci. 49, 299 (2010): FCC points in units of 2 pi / a.
        var lat = Lattice.Create(LatticeKind.FaceCentredCubic, 3.0);
        double u = 2 * Math.PI / 3.0;
        Assert.Equal("X", HighSymmetryLocator.Locate(lat, new Vec3(u, 0, 0)));
        Assert.Equal("X", HighSymmetryLocator.Locate(lat, new Vec3(0, 0, -u)));
        Assert.Equal("L", HighSymmetryLocator.Locate(lat, new Vec3(-0.5 * u, 0.5 * u, 0.5 * u)));
        Assert.Equal("W", HighSymmetryLocator.Locate(lat, new Vec3(u, 0.5 * u, 0)));
        Assert.Equal("Gamma", HighSymmetryLocator.Locate(lat, new Vec3(2 * u, 0, 0)));   // a reciprocal lattice vector
        Assert.Equal("on Gamma-X", HighSymmetryLocator.Locate(lat, new Vec3(0, 0.3 * u, 0)));
        Assert.Equal("on X-W", HighSymmetryLocator.Locate(lat, new Vec3(0.2 * u, u, 0)));
        Assert.Null(HighSymmetryLocator.Locate(lat, new Vec3(0.13 * u, 0.31 * u, 0.07 * u)));
    }
}
