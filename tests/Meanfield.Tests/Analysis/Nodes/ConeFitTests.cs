using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;
using Meanfield.Tests.Heat;

namespace Meanfield.Tests.Analysis.Nodes;

/// <summary>
/// The cone fit against the analytic cone of the two-band lattice Weyl model (TiltedWeylLattice): at the node
/// k = (0, 0, pi/(2a)) the velocity tensor is t a diag(1, 1, -1), so every singular velocity is t a and
/// |det v| = (t a)^3, and the tilt ratio w = sqrt(v0^T (v v^T)^-1 v0) equals the model's c: type I below 1, type II
/// above (Soluyanov et al., "Type-II Weyl semimetals", Nature 527, 495 (2015), for the criterion; the cone of
/// H = v0.q + q.v.sigma is common practice). Checked as a narrow pair inside remote bands 400 times wider, and with
/// every energy x 1000 and the lattice constant doubled: the reduced answers (w, singular / (t a)) must not move.
/// </summary>
public class ConeFitTests
{
    [Theory]
    [InlineData(10.0, 3.0, 0.6, 0.0)]       // type I, bare pair
    [InlineData(10.0, 3.0, 1.5, 0.0)]       // type II
    [InlineData(10.0, 3.0, 0.6, 2000.0)]    // type I inside remote bands 2 x 2000 meV: the heavy-band situation
    [InlineData(10000.0, 6.0, 0.6, 2e6)]    // every energy x 1000, lattice constant x 2
    [InlineData(0.01, 3.0, 1.5, 2.0)]       // every energy / 1000, type II
    public void FitsTheAnalyticTiltedCone(double t, double a, double c, double remote)
    {
        var source = new TiltedWeylLattice(t, a, c, remote);
        var ws = new BlochWorkspace(source);
        var node = new Vec3(0, 0, Math.PI / (2 * a));
        int lower = remote > 0 ? 1 : 0;
        // A step small against the node's distance to the zone edge (pi/(2a)): the band curvature enters at h^2.
        double h = 1e-3 / a;
        var fit = ConeFit.Compute(ws, node, lower, h, 3);

        Assert.Equal(c, fit.TiltRatio, 1e-6);
        Assert.Equal(c > 1, fit.IsTypeII);
        foreach (double s in fit.Singular) Assert.Equal(1.0, s / (t * a), 1e-6);
        Assert.Equal(1.0, fit.DetVelocity / Math.Pow(t * a, 3), 1e-6);
        Assert.Equal(-c * t * a, fit.Tilt.Z, 1e-6 * t * a);
    }
}
