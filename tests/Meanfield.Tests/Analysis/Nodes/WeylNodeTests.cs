using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Nodes;

public class WeylNodeTests
{
    // Invented parameters: t = 0.7 energy units, a = 2 angstrom, k0 a = 1.2 (nodes off the coarse mesh).
    private const double T = 0.7, A = 2.0, K0A = 1.2;

    [Fact]
    public void LatticeWeylModelHasTwoNodesOfOppositeChirality()
    {
        var r = NodeSearch.Find(AnalysisModels.LatticeWeyl(T, K0A, A), occupied: 1, chemicalPotential: 0);
        Assert.Equal(2, r.Nodes.Count);
        Assert.False(r.FermiSurfaceAwayFromNodes);
        // Nielsen & Ninomiya, Nucl. Phys. B 185, 20 (1981): chiralities over the zone sum to zero.
        Assert.Equal(0, r.ChiralitySum);
        foreach (var n in r.Nodes)
        {
            Assert.Equal(0, n.Cartesian.X, 6);
            Assert.Equal(0, n.Cartesian.Y, 6);
            Assert.Equal(K0A / A, Math.Abs(n.Cartesian.Z), 6);
            Assert.Equal(1.0, Math.Abs(n.FluxOver2Pi!.Value), 6);
            // Chirality = sign det v for H = sum q_i v_ij sigma_j (Armitage, Mele & Vishwanath, RMP 90, 015001 (2018));
            // here v = diag(t a, t a, -t a sin(k0 a) sign(kz)).
            Assert.Equal(-Math.Sign(n.Cartesian.Z), n.Chirality);
            // Singular values of v: t a, t a, t a sin(k0 a) (expand sin and cos about the node).
            Assert.Equal(T * A, n.VelocitySingular[0], 4);
            Assert.Equal(T * A, n.VelocitySingular[1], 4);
            Assert.Equal(T * A * Math.Sin(K0A), n.VelocitySingular[2], 4);
            Assert.Equal(T * T * T * A * A * A * Math.Sin(K0A), n.DetVelocity, 3);
            Assert.Equal(NodeType.TypeI, n.Type);
            Assert.Equal(2, n.Degeneracy);
            Assert.Equal(0, n.EnergyOffset, 9);
            Assert.Equal("on Gamma-X", n.Location);
        }
    }

    [Fact]
    public void MirrorImageFlipsChiralities()
    {
        var plain = NodeSearch.Find(AnalysisModels.LatticeWeyl(T, K0A, A), 1, 0).Nodes.OrderBy(n => n.Cartesian.Z).ToList();
        var mirror = NodeSearch.Find(AnalysisModels.LatticeWeyl(T, K0A, A, mirror: -1), 1, 0).Nodes.OrderBy(n => n.Cartesian.Z).ToList();
        Assert.Equal(2, mirror.Count);
        for (int i = 0; i < 2; i++) Assert.Equal(-plain[i].Chirality, mirror[i].Chirality);
    }

    [Theory]
    [InlineData(1, 1)]
    [InlineData(-1, -1)]
    public void KpConeChiralityFollowsTheSignOfV(int sign, int expected)
    {
        // H = s v q.sigma: lower state of B.sigma carries Berry phase +Omega/2 (Berry, Proc. R. Soc. Lond. A 392, 45
        // (1984)), so the occupied band has flux +2 pi s through an outward sphere: chirality s.
        var k0 = new Vec3(0.1, -0.2, 0.3);
        var flux = SphereChirality.Compute(new AnalysisModels.KpWeyl(1.3, k0, sign), k0, 0.01, occupied: 1);
        Assert.Equal(expected, flux.Chirality);
        Assert.Equal(expected, flux.FluxOver2Pi, 8);
    }

    [Fact]
    public void LowEnergyDosFollowsTheConeLaw()
    {
        // rho(E) = V_cell E^2 / (2 pi^2 |det v|) per node per cell: a sphere |v q| < E holds (4 pi / 3) E^3 / |det v|
        // of k-space, i.e. V_cell E^3 / (6 pi^2 |det v|) states per cell (common practice: the cone volume counted in k-space).
        // Window 0.2 t .. 0.3 t: above the tetrahedra that contain the node, below the curvature of the bands.
        var src = AnalysisModels.LatticeWeyl(1.0, Math.PI / 2, 1.0);
        var nodes = NodeSearch.Find(src, 1, 0).Nodes;
        Assert.Equal(2, nodes.Count);
        var dos = new TetrahedronDos(src, new KMesh(src.Model.Lattice, 48)).Compute(new DosOptions { Points = 41, Minimum = 0, Maximum = 0.4 });
        double sum = 0; int count = 0;
        for (int i = 0; i < dos.Energies.Length; i++)
        {
            double e = dos.Energies[i];
            if (e < 0.2 - 1e-9 || e > 0.3 + 1e-9) continue;
            double expected = nodes.Sum(n => src.Model.Lattice.CellVolume * e * e / (2 * Math.PI * Math.PI * n.DetVelocity));
            sum += dos.Total[i] / expected; count++;
        }
        Assert.InRange(sum / count, 0.95, 1.05);
    }
}
