using System.Numerics;
using Meanfield.Analysis.Surfaces;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Surfaces;

/// <summary>
/// The decimation against the semi-infinite tight-binding chain, G_s(z) = (z - sqrt(z^2 - 4 t^2)) / (2 t^2) on the
/// branch with Im G_s &lt;= 0 (Economou, Green's Functions in Quantum Physics, 3rd ed. (2006), ch. 5), and thick
/// slabs against the semi-infinite surface (a slab's outer layer converges to the semi-infinite surface once it is
/// thicker than the decay length v / eta of the broadened states; common practice).
/// </summary>
public sealed class SurfaceGreenFunctionTests
{
    private const double T = 1.3;

    private static Complex ChainSurface(Complex z, double t)
    {
        var root = Complex.Sqrt(z * z - 4 * t * t);
        var g = (z - root) / (2 * t * t);
        return g.Imaginary <= 0 ? g : (z + root) / (2 * t * t);
    }

    [Theory]
    [InlineData(0.0, 1e-4, 1e-7)]
    [InlineData(0.7, 1e-9, 1e-9)]
    [InlineData(-2.4, 1e-9, 1e-9)]
    [InlineData(2.55, 1e-6, 1e-9)]
    [InlineData(4.0, 1e-3, 1e-9)]
    [InlineData(-1.9, 0.05, 1e-9)]
    public void Chain_surface_green_function(double energy, double eta, double tolerance)
    {
        // At energies where the chain's wavelength is a power of two sites (E = 0: four sites) the doubling steps are
        // commensurate and only eta damps the couplings; eta below ~1e-6 t then loses digits, so E = 0 uses 1e-4 t.
        var d = new Decimation(1);
        var z = new Complex(energy, eta);
        var r = d.Solve([Complex.Zero], [new Complex(T, 0)], z);
        Assert.True(r.Converged);
        var expected = ChainSurface(z, T);
        Assert.True(Complex.Abs(d.Surface[0] - expected) < tolerance * Complex.Abs(expected), $"G_s = {d.Surface[0]}, chain formula {expected}");
        Assert.True(d.Surface[0].Imaginary <= 0);
        // The bulk site of the infinite chain: G_b = 1 / sqrt(z^2 - 4 t^2) with Im <= 0 (same source).
        var gb = 1 / Complex.Sqrt(z * z - 4 * T * T);
        if (gb.Imaginary > 0) gb = -gb;
        Assert.True(Complex.Abs(d.Bulk[0] - gb) < 10 * tolerance * Complex.Abs(gb), $"G_b = {d.Bulk[0]}, expected {gb}");
        // O(log) convergence: about log2(t / eta) + a few steps.
        Assert.InRange(r.Steps, 1, (int)Math.Ceiling(Math.Log2(T / eta)) + 8);
    }

    [Fact]
    public void Cubic_001_surface_is_the_chain_shifted_by_the_in_plane_band()
    {
        // Simple cubic, hopping -t: each k_par of the (001) face is a chain with on-site energy
        // eps_par = -2t (cos kx a + cos ky a) (separable band; Economou ch. 5 for the chain).
        var bulk = SurfaceModels.Chains(T, inPlane: true);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 0, 0, 1));
        Assert.Equal(1, cut.BlockSize);
        var kPar = new Vec3(0.8, -0.3, 0);
        double epsPar = -2 * T * (Math.Cos(kPar.X) + Math.Cos(kPar.Y));
        double eta = 1e-4;
        var path = new BandPathSample([kPar], [0.0], [""], [], [0]);
        double[] energies = [-5, -3, -1, 0, 1, 2.5, 5];
        var s = SurfaceSpectra.AlongPath(cut, path, energies, eta);
        Assert.Equal(0, s.NotConverged);
        for (int e = 0; e < energies.Length; e++)
        {
            double expected = -ChainSurface(new Complex(energies[e] - epsPar, eta), T).Imaginary / Math.PI;
            Assert.Equal(expected, s.Surface[0, e], 8);
        }
    }

    [Fact]
    public void Thick_slab_outer_layer_matches_the_semi_infinite_surface()
    {
        var bulk = SurfaceModels.FuKaneMele(1, 0.125, 0.4);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 1, 1, 1), "A");
        var slab = new Slab(cut, 48);
        double eta = 0.15;
        var kPar = 0.3 * cut.Zone.Points["K"];
        var path = new BandPathSample([kPar], [0.0], [""], [], [0]);
        double[] energies = [-2.5, -1.0, -0.2, 0.0, 0.35, 1.4];
        var s = SurfaceSpectra.AlongPath(cut, path, energies, eta);
        for (int e = 0; e < energies.Length; e++)
        {
            double fromSlab = SurfaceModels.SlabTopSpectral(slab, kPar, new Complex(energies[e], eta));
            Assert.True(Math.Abs(fromSlab - s.Surface[0, e]) < 1e-3 * Math.Max(s.Surface[0, e], 0.1),
                $"E = {energies[e]}: slab {fromSlab}, decimation {s.Surface[0, e]}");
        }
    }

    [Fact]
    public void Skin_potential_on_the_surface_layer_matches_a_slab_with_the_same_potential()
    {
        var bulk = SurfaceModels.FuKaneMele(1, 0.125, 0.4);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 0, 0, 1), "A");
        var skin = new SkinPotential(0.6, 2);
        var slab = new Slab(cut, 48, skin);
        double eta = 0.15;
        var kPar = 0.4 * cut.Zone.Points["M"];
        var path = new BandPathSample([kPar], [0.0], [""], [], [0]);
        double[] energies = [-1.5, 0.1, 0.9];
        var s = SurfaceSpectra.AlongPath(cut, path, energies, eta, skin);
        var plain = SurfaceSpectra.AlongPath(cut, path, energies, eta);
        for (int e = 0; e < energies.Length; e++)
        {
            double fromSlab = SurfaceModels.SlabTopSpectral(slab, kPar, new Complex(energies[e], eta));
            Assert.True(Math.Abs(fromSlab - s.Surface[0, e]) < 1e-3 * Math.Max(s.Surface[0, e], 0.1),
                $"E = {energies[e]}: slab {fromSlab}, decimation {s.Surface[0, e]}");
            Assert.True(Math.Abs(plain.Surface[0, e] - s.Surface[0, e]) > 1e-3, "the potential must change the surface");
        }
    }
}
