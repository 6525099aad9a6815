using Meanfield.Analysis.Curvature;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Curvature;

public class BerryCurvatureTests
{
    private static readonly Vec3 B1 = new(1, 0, 0), B2 = new(0, 1, 0);

    [Fact]
    public void ChernNumbersOfKzPlanesJumpByTheNodeChirality()
    {
        // Gauss's law on the slab between two kz planes: C(upper) - C(lower) = chirality enclosed (the planes' normals
        // +z and -z are the outward normals of the slab). Planes between the nodes through kz = 0 are trivial for
        // this model, those through kz = pi/a carry |C| = 1 (Armitage, Mele & Vishwanath, RMP 90, 015001 (2018)).
        var src = AnalysisModels.LatticeWeyl(0.7, 1.2, 2.0);
        var upperNode = NodeSearch.Find(src, 1, 0).Nodes.Single(n => n.Cartesian.Z > 0);
        double kz0 = 1.2 / (2 * Math.PI);                         // reduced coordinate of the node
        int C(double u3) => BerryCurvature.Compute(src, new Vec3(0, 0, u3), B1, B2, 24, 24, 1).ChernNumber;
        Assert.Equal(0, C(0));
        Assert.Equal(1, Math.Abs(C(0.5)));
        Assert.Equal(upperNode.Chirality, C(kz0 + 0.05) - C(kz0 - 0.05));
    }

    [Fact]
    public void FullTorusFluxIsAnIntegerWithTwoSites()
    {
        // Fukui, Hatsugai & Suzuki (2005): the lattice Chern number is an integer on any grid; with two sites this
        // checks the convention-II phases that close the torus.
        var src = AnalysisModels.FuKaneMele(1.0, 0.125, 0.3, 0.8);
        var map = BerryCurvature.Compute(src, new Vec3(0, 0, 0.13), B1, B2, 12, 12, 2);
        Assert.True(map.IsFullTorus);
        Assert.Equal(map.ChernNumber, map.TotalFluxOver2Pi, 8);
    }

    [Fact]
    public void DegeneratePlaneIsRejected()
    {
        var src = AnalysisModels.LatticeWeyl(0.7, 1.2, 2.0);
        Assert.Throws<ArgumentException>(() => BerryCurvature.Compute(src, Vec3.Zero, B1, 2 * B1, 8, 8, 1));
        Assert.Throws<ArgumentException>(() => BerryCurvature.Compute(src, Vec3.Zero, B1, Vec3.Zero, 8, 8, 1));
        var sq = AnalysisModels.Square(1.0);
        Assert.Throws<ArgumentException>(() => BerryCurvature.Compute(sq, new Vec3(0, 0, 0.2), B1, B2, 8, 8, 1));
    }
}
