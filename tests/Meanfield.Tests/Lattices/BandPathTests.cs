using Meanfield.Lattices;

namespace Meanfield.Tests.Lattices;

public class BandPathTests
{
    private const double A = 4.0;
    private static double Unit => 2 * Math.PI / A;

    // Point coordinates: Setyawan & Curtarolo, Comput. Mater. Sci. 49, 299 (2010), tables for CUB, FCC, BCC, and the
    // 2D square and hexagonal zones; here they are checked against their defining property instead of re-typed:
    // a zone-boundary point is equidistant from Gamma and from its nearest reciprocal lattice vector G,
    // |k| = |k - G| (Bragg plane; Ashcroft & Mermin, Solid State Physics (1976), ch. 5).
    [Theory]
    [InlineData(LatticeKind.SimpleCubic, "X")]
    [InlineData(LatticeKind.SimpleCubic, "M")]
    [InlineData(LatticeKind.SimpleCubic, "R")]
    [InlineData(LatticeKind.FaceCentredCubic, "X")]
    [InlineData(LatticeKind.FaceCentredCubic, "W")]
    [InlineData(LatticeKind.FaceCentredCubic, "K")]
    [InlineData(LatticeKind.FaceCentredCubic, "L")]
    [InlineData(LatticeKind.FaceCentredCubic, "U")]
    [InlineData(LatticeKind.Diamond, "X")]
    [InlineData(LatticeKind.Diamond, "W")]
    [InlineData(LatticeKind.Diamond, "K")]
    [InlineData(LatticeKind.Diamond, "L")]
    [InlineData(LatticeKind.Diamond, "U")]
    [InlineData(LatticeKind.BodyCentredCubic, "H")]
    [InlineData(LatticeKind.BodyCentredCubic, "N")]
    [InlineData(LatticeKind.BodyCentredCubic, "P")]
    [InlineData(LatticeKind.Square, "X")]
    [InlineData(LatticeKind.Square, "M")]
    [InlineData(LatticeKind.Honeycomb, "M")]
    [InlineData(LatticeKind.Honeycomb, "K")]
    public void ZoneBoundaryPointsLieOnABraggPlane(LatticeKind kind, string label)
    {
        var lattice = Lattice.Create(kind, A);
        var k = HighSymmetryPoints.Cartesian(lattice, label);
        double best = double.PositiveInfinity;
        for (int i = -2; i <= 2; i++)
            for (int j = -2; j <= 2; j++)
                for (int l = (lattice.Dimension == 3 ? -2 : 0); l <= (lattice.Dimension == 3 ? 2 : 0); l++)
                {
                    if (i == 0 && j == 0 && l == 0) continue;
                    var g = lattice.Cartesian(i, j, l);
                    best = Math.Min(best, (k - g).Norm);
                }
        Assert.Equal(k.Norm, best, 9); // no G closer than Gamma, and one as close: k is on the zone boundary
    }

    [Fact]
    public void FccGammaToXIsTwoPiOverA()
    {
        // |Gamma-X| = 2 pi / a for the FCC zone (Setyawan & Curtarolo 2010, FCC table: X = (0, 1, 0) 2pi/a).
        var sample = BandPath.Default(Lattice.Create(LatticeKind.FaceCentredCubic, A)).Sample(200);
        var x = sample.Ticks[1];
        Assert.Equal("X", x.Label);
        Assert.Equal(2 * Math.PI / A, x.Position, 12);
        Assert.Equal(2 * Math.PI / A, sample.K[x.Index].Norm, 12);
    }

    [Fact]
    public void SimpleCubicDefaultPathHasTheStandardTicksAndBreak()
    {
        // Standard path Gamma-X-M-Gamma-R-X|M-R (Setyawan & Curtarolo 2010).
        var sample = BandPath.Default(Lattice.Create(LatticeKind.SimpleCubic, A)).Sample(150);
        Assert.Equal(150, sample.Count);
        Assert.Equal(["G", "X", "M", "G", "R", "X|M", "R"], sample.Ticks.Select(t => t.Label));
        Assert.Equal(["Γ", "X", "M", "Γ", "R", "X|M", "R"], sample.Ticks.Select(t => t.DisplayLabel));
        Assert.Equal(2, sample.SegmentStarts.Count);
        int brk = sample.SegmentStarts[1];
        Assert.Equal("X", sample.Labels[brk - 1]);
        Assert.Equal("M", sample.Labels[brk]);
        Assert.Equal(sample.Length[brk - 1], sample.Length[brk]);   // a break does not advance the path length
        // Leg lengths in units of 2 pi / a: 1/2, 1/2, 1/sqrt2, sqrt3/2, 1/sqrt2, then 1/2.
        double expected = Unit * (0.5 + 0.5 + Math.Sqrt(0.5) + Math.Sqrt(0.75) + Math.Sqrt(0.5) + 0.5);
        Assert.Equal(expected, sample.Length[^1], 10);
        for (int i = 1; i < sample.Count; i++) Assert.True(sample.Length[i] >= sample.Length[i - 1]);
        for (int i = 1; i < sample.Count; i++) if (i != brk) Assert.True(sample.Length[i] > sample.Length[i - 1]);
        foreach (var t in sample.Ticks)
            foreach (var part in t.Label.Split('|'))
                Assert.Contains(Enumerable.Range(0, sample.Count), i => sample.Labels[i] == part && Math.Abs(sample.Length[i] - t.Position) < 1e-12);
    }

    [Fact]
    public void PathLengthMatchesTheDistanceBetweenConsecutiveKPoints()
    {
        var sample = BandPath.Default(Lattice.Create(LatticeKind.BodyCentredCubic, A)).Sample(97);
        Assert.Equal(97, sample.Count);
        for (int s = 0; s < sample.SegmentStarts.Count; s++)
            for (int i = sample.SegmentStarts[s] + 1; i < sample.SegmentEnd(s); i++)
                Assert.Equal((sample.K[i] - sample.K[i - 1]).Norm, sample.Length[i] - sample.Length[i - 1], 10);
        Assert.Equal(["G", "H", "N", "G", "P", "H|P", "N"], sample.Ticks.Select(t => t.Label));
    }

    [Theory]
    [InlineData(LatticeKind.FaceCentredCubic, "G-X-W-K-G-L-U-W-L-K|U-X")]
    [InlineData(LatticeKind.Diamond, "G-X-W-K-G-L-U-W-L-K|U-X")]
    [InlineData(LatticeKind.Square, "G-X-M-G")]
    [InlineData(LatticeKind.Honeycomb, "G-M-K-G")]
    public void DefaultPaths(LatticeKind kind, string expected) =>
        Assert.Equal(expected, BandPath.Default(Lattice.Create(kind, A)).ToString());

    [Fact]
    public void UserPathsAcceptGammaSpellingsSpacesDashesAndBreaks()
    {
        var fcc = Lattice.Create(LatticeKind.FaceCentredCubic, A);
        Assert.Equal("G-X-W-L-G", BandPath.Parse("G X W L G", fcc).ToString());
        Assert.Equal("G-X-W|L-G", BandPath.Parse("Gamma-X-W|L-Γ", fcc).ToString());
        Assert.Equal("G-X-W|L-G", BandPath.Parse(" gamma - X - W | L - G ", fcc).ToString());
    }

    [Fact]
    public void UnknownLabelIsNamedWithTheValidOnes()
    {
        var ex = Assert.Throws<RequestError>(() => BandPath.Parse("G-X-Q-L", Lattice.Create(LatticeKind.FaceCentredCubic, A)));
        Assert.Contains("'Q'", ex.Message);
        foreach (var l in new[] { "G", "X", "W", "K", "L", "U" }) Assert.Contains(l, ex.Message);
    }

    [Fact]
    public void ReducedCoordinatesWorkForExplicitLattices()
    {
        var lattice = new Lattice(LatticeKind.Explicit, A, 3, new(A, 0, 0), new(0, A, 0), new(0, 0, 2 * A));
        Assert.Throws<RequestError>(() => BandPath.Default(lattice));
        var path = BandPath.Parse("0,0,0 0.5,0,0 | Z=0,0,0.5 -0.5,0,0.5", lattice);
        var sample = path.Sample(40);
        Assert.Equal(["0,0,0", "0.5,0,0|Z", "-0.5,0,0.5"], sample.Ticks.Select(t => t.Label));
        // b3 = 2 pi / (2a) along z; the second piece runs along x at kz = pi/(2a).
        Assert.Equal(Math.PI / (2 * A), sample.K[sample.SegmentStarts[1]].Z, 12);
        Assert.Equal(-Math.PI / A, sample.K[^1].X, 12);
        Assert.Throws<RequestError>(() => BandPath.Parse("0,0,0 0.5,x,0", lattice));
        Assert.Throws<RequestError>(() => BandPath.Parse("G X", lattice));
    }

    [Fact]
    public void DegeneratePathsAreRejected()
    {
        var sc = Lattice.Create(LatticeKind.SimpleCubic, A);
        Assert.Throws<RequestError>(() => BandPath.Parse("G-X|M", sc));
        Assert.Throws<RequestError>(() => BandPath.Parse("G-G-X", sc));
        Assert.Throws<RequestError>(() => BandPath.Parse("G-X-M", sc).Sample(2));
        Assert.Throws<RequestError>(() => BandPath.Default(Lattice.Create(LatticeKind.FlatDos, A)));
    }
}
