using System.Numerics;
using Meanfield.Analysis.Surfaces;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Tests.Analysis.Surfaces;

/// <summary>
/// Lattice planes, surface zones and principal layers against crystallography facts: interplanar spacings
/// d_hkl = a / sqrt(h^2 + k^2 + l^2) for simple cubic, d_111 = a / sqrt(3) and d_001 = a / 2 for FCC (its (001) planes
/// are the (002) reflection), surface cell area x d = primitive-cell volume, the 2D lattice types of the low-index
/// cubic faces (Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 5 and 7; common practice), and Bloch's theorem
/// along the normal: H00 + e^{i phi} H01 + h.c. has the bulk eigenvalues at k_par + (phi / D) n.
/// </summary>
public sealed class SurfaceGeometryTests
{
    private const double A = 5.0;

    [Theory]
    [InlineData(LatticeKind.SimpleCubic, 0, 0, 1, 1.0, SurfaceLatticeType.Square)]
    [InlineData(LatticeKind.SimpleCubic, 1, 1, 0, 0.70710678118654752, SurfaceLatticeType.Rectangular)]
    [InlineData(LatticeKind.SimpleCubic, 1, 1, 1, 0.57735026918962576, SurfaceLatticeType.Hexagonal)]
    [InlineData(LatticeKind.SimpleCubic, 2, 1, 0, 0.44721359549995794, SurfaceLatticeType.Rectangular)]
    [InlineData(LatticeKind.FaceCentredCubic, 1, 1, 1, 0.57735026918962576, SurfaceLatticeType.Hexagonal)]
    [InlineData(LatticeKind.FaceCentredCubic, 0, 0, 1, 0.5, SurfaceLatticeType.Square)]
    [InlineData(LatticeKind.FaceCentredCubic, 1, 1, 0, 0.35355339059327376, SurfaceLatticeType.Rectangular)]
    [InlineData(LatticeKind.BodyCentredCubic, 0, 0, 1, 0.5, SurfaceLatticeType.Square)]
    [InlineData(LatticeKind.BodyCentredCubic, 1, 1, 0, 0.70710678118654752, SurfaceLatticeType.Oblique)]
    public void Spacing_area_and_surface_lattice_type(LatticeKind kind, int h, int k, int l, double spacingOverA, SurfaceLatticeType type)
    {
        var lattice = Lattice.Create(kind, A);
        var plane = LatticePlane.FromIndices(lattice, h, k, l);
        Assert.Equal(spacingOverA * A, plane.Spacing, 10);
        // The in-plane cell times the plane spacing is the primitive cell (the three vectors are a lattice basis).
        Assert.Equal(lattice.CellVolume, plane.A1.Cross(plane.A2).Dot(plane.Normal) * plane.Spacing, 8);
        Assert.Equal(plane.Spacing, plane.A3.Dot(plane.Normal), 10);
        Assert.Equal(0.0, plane.A1.Dot(plane.Normal), 10);
        Assert.Equal(0.0, plane.A2.Dot(plane.Normal), 10);
        // The normal points along (h, k, l) in Cartesian axes.
        var dir = new Vec3(h, k, l);
        Assert.Equal(1.0, plane.Normal.Dot(dir / dir.Norm), 10);
        Assert.Equal(type, new SurfaceZone(plane).Type);
    }

    [Fact]
    public void Hexagonal_zone_points_lie_at_the_textbook_distances()
    {
        // A triangular lattice of spacing b_s: |Gamma-M| = 2 pi / (sqrt(3) b_s), |Gamma-K| = 4 pi / (3 b_s) (common practice).
        var plane = LatticePlane.FromIndices(Lattice.Create(LatticeKind.FaceCentredCubic, A), 1, 1, 1);
        var zone = new SurfaceZone(plane);
        double bs = plane.A1.Norm;
        Assert.Equal(A / Math.Sqrt(2), bs, 10);
        Assert.Equal(2 * Math.PI / (Math.Sqrt(3) * bs), zone.Points["M"].Norm, 10);
        Assert.Equal(4 * Math.PI / (3 * bs), zone.Points["K"].Norm, 10);
        Assert.Equal(6, zone.Boundary.Count);
        foreach (var (s1, s2) in zone.Boundary) Assert.Equal(4 * Math.PI / (3 * bs), Math.Sqrt(s1 * s1 + s2 * s2), 8);
    }

    [Fact]
    public void Bad_planes_and_models_are_refused_with_a_message()
    {
        var cubic = Lattice.Create(LatticeKind.SimpleCubic, A);
        Assert.Contains("do not define a lattice plane", Assert.Throws<RequestError>(() => LatticePlane.FromIndices(cubic, 0, 0, 0)).Message);
        Assert.Contains("not an integer", Assert.Throws<RequestError>(() => LatticePlane.Parse("1,x,0", cubic)).Message);
        Assert.Contains("three integers", Assert.Throws<RequestError>(() => LatticePlane.Parse("1,1", cubic)).Message);
        Assert.Contains("3D model", Assert.Throws<RequestError>(() => LatticePlane.FromIndices(Lattice.Create(LatticeKind.Square, A), 0, 0, 1)).Message);
        var model = SurfaceModels.FuKaneMele(1, 0.125, 0.4).Model;
        var plane = LatticePlane.FromIndices(model.Lattice, 1, 1, 1);
        Assert.Contains("did you mean 'A'", Assert.Throws<RequestError>(() => new SurfaceCut(model, plane, "a1")).Message);
        Assert.Contains("at least 2", Assert.Throws<RequestError>(() => new Slab(new SurfaceCut(model, plane, "A"), 1)).Message);
    }

    [Fact]
    public void Diamond_111_terminations_put_the_named_site_on_top()
    {
        // The diamond (111) face: with A outermost, B sits a quarter plane spacing below (three bonds down, one
        // dangling bond up); with B outermost, A sits three quarters below (common practice).
        var model = SurfaceModels.FuKaneMele(1, 0.125, 0.4).Model;
        var plane = LatticePlane.FromIndices(model.Lattice, 1, 1, 1);
        var a = new SurfaceCut(model, plane, "A");
        Assert.Equal(["A"], a.TopSites);
        Assert.Equal(-0.25, a.SiteHeights[1] - a.SiteHeights[0], 10);
        var b = new SurfaceCut(model, plane, "B");
        Assert.Equal(["B"], b.TopSites);
        Assert.Equal(-0.75, b.SiteHeights[0] - b.SiteHeights[1], 10);
        Assert.Equal(1, a.ElementaryLayers);
    }

    public static TheoryData<int, int, int, string> Faces => new()
    {
        { 1, 1, 1, "A" }, { 1, 1, 1, "B" }, { 0, 0, 1, "A" }, { 1, 1, 0, "B" }, { 2, 1, 1, "A" },
    };

    [Theory]
    [MemberData(nameof(Faces))]
    public void Layer_blocks_reproduce_the_bulk_bands(int h, int k, int l, string termination)
    {
        // Bloch's theorem along the normal (common practice): with P elementary layers per principal layer of
        // thickness D = P d, the eigenvalues of H00 + e^{i phi} H01 + h.c. are the bulk bands at
        // k_par + ((phi + 2 pi m) / D) n, m = 0..P-1, all together.
        var bulk = SurfaceModels.FuKaneMele(1, 0.125, 0.3, 0.2);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, h, k, l), termination);
        var projected = new ProjectedBulk(cut);
        int nb = cut.BlockSize, n = bulk.Size, p = cut.ElementaryLayers;
        var layerValues = new double[nb];
        var bulkValues = new List<double>();
        var hk = new Complex[n * n]; var scratch = new Complex[n * n]; var values = new double[n];
        var solver = Eigensolvers.Create(n);
        var kPar = 0.37 * cut.Zone.B1 + 0.21 * cut.Zone.B2;
        foreach (double phi in new[] { 0.0, 1.1, 2.9 })
        {
            projected.Bands(kPar, phi, layerValues);
            bulkValues.Clear();
            for (int m = 0; m < p; m++)
            {
                double kappa = (phi + 2 * Math.PI * m) / (p * cut.Plane.Spacing);
                bulk.Assemble(kPar + kappa * cut.Plane.Normal, hk, scratch);
                solver.Solve(hk, values, Span<Complex>.Empty);
                bulkValues.AddRange(values);
            }
            bulkValues.Sort();
            for (int i = 0; i < nb; i++) Assert.Equal(bulkValues[i], layerValues[i], 9);
        }
    }
}
