using Meanfield.Analysis.Curvature;
using Meanfield.Analysis.Responses;
using Meanfield.Analysis.Topology;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>Chern numbers and the intrinsic anomalous Hall conductivity against Haldane's model and the massive Dirac cone.</summary>
public sealed class HallResponseTests
{
    private const double T1 = 1, T2 = 0.2, Phi = Math.PI / 2;
    // Haldane, PRL 61, 2015 (1988): the Chern phase is |M| < 3 sqrt(3) |t2 sin phi|.
    private static readonly double Boundary = 3 * Math.Sqrt(3) * T2 * Math.Sin(Phi);

    [Theory]
    [InlineData(0.0, 1)]
    [InlineData(0.8, 1)]
    [InlineData(1.2, 0)]
    [InlineData(-0.8, 1)]
    public void HaldaneChernNumberIsOneInsideThePublishedBoundaryAndZeroOutside(double mOverBoundary, int magnitude)
    {
        var plus = ChernInvariant.Compute(TopologyModels.Haldane(T1, T2, Phi, mOverBoundary * Boundary), 1, 24, 8);
        var minus = ChernInvariant.Compute(TopologyModels.Haldane(T1, T2, -Phi, mOverBoundary * Boundary), 1, 24, 8);
        Assert.Equal(InvariantStatus.Determined, plus.Status);
        Assert.Equal(magnitude, Math.Abs(plus.Chern!.Value));
        // Time reversal (phi -> -phi) reverses the Chern number (Haldane 1988).
        Assert.Equal(-plus.Chern.Value, minus.Chern!.Value);
    }

    [Fact]
    public void HaldaneModelOnItsPhaseBoundaryIsGapless()
    {
        // On |M| = 3 sqrt(3) t2 sin phi the gap closes at one zone corner (Haldane 1988): no Chern number.
        var r = ChernInvariant.Compute(TopologyModels.Haldane(T1, T2, Phi, Boundary), 1, 24, 12);
        Assert.Equal(InvariantStatus.Gapless, r.Status);
        Assert.Null(r.Chern);
    }

    /// <summary>
    /// Haldane 1988: in the Chern phase sigma_xy = +-e^2/h. With sigma = -(e^2/hbar) Int f Omega (our sign), a filled
    /// band of Chern number C gives exactly -C e^2/h; the midpoint rule converges exponentially for a gapped band.
    /// </summary>
    [Fact]
    public void HaldaneHallConductanceIsMinusChernInUnitsOfTheConductanceQuantum()
    {
        var h = TopologyModels.Haldane(T1, T2, Phi, 0.3 * Boundary);
        int c = ChernInvariant.Compute(h, 1, 24, 8).Chern!.Value;
        var sigma = AnomalousHall.Compute(h, [0.0], [0.0, 0.02], new ResponseMesh { Divisions = 48 });
        Assert.Equal("e^2/h", sigma.Unit);
        Assert.Equal(-c, sigma.Conductivity[0, 0].Z, 3);
        Assert.Equal(-c, sigma.Conductivity[1, 0].Z, 3);
        // Far above the bands everything is filled: a full set of bands carries no net Chern number (common practice).
        var full = AnomalousHall.FromSamples(sigma.Samples, [100.0], [0.0]);
        Assert.Equal(0, full.Conductivity[0, 0].Z, 9);
    }

    [Fact]
    public void KuboCurvatureMatchesTheLinkVariableFluxOnAPlaquette()
    {
        // Two routes to the same curvature: the Kubo sum (Xiao, Chang & Niu 2010, Eq. 1.13) and the plaquette flux
        // (Fukui, Hatsugai & Suzuki 2005) divided by the plaquette area, at the plaquette centre, for a fine grid.
        var h = TopologyModels.Haldane(T1, T2, Phi, 0.3 * Boundary);
        var map = BerryCurvature.Compute(h, new Vec3(0.3, 0.1, 0), new Vec3(0.004, 0, 0), new Vec3(0, 0.004, 0), 4, 4, 1);
        var g = new BandGeometry(h, new VelocityOperator(h));
        for (int i = 0; i < 4; i++)
            for (int j = 0; j < 4; j++)
            {
                g.Compute(map.CentreCartesian[i, j]);
                Assert.Equal(map.Omega[i, j], g.Curvatures[2], 1e-4 * Math.Abs(map.Omega[i, j]) + 1e-9);
            }
    }

    /// <summary>
    /// A massive Dirac cone H = v(k_x s_x + k_y s_y) + m s_z (common practice; derived here): the lower band has
    /// Omega = m v^2 / (2 E^3), E = sqrt(v^2 k^2 + m^2) (with A = i&lt;u|grad u&gt;), so with k = |m| tan(theta) / v
    /// Int d^2k/(2 pi)^2 Omega over a disc of radius K is sign(m) (1 - cos theta_K) / (4 pi), and
    /// sigma_xy = -(e^2/hbar) of that is -sign(m) (1 - cos theta_K) e^2/(2h), tending to -sign(m) e^2/(2h).
    /// </summary>
    [Theory]
    [InlineData(0.1)]
    [InlineData(-0.1)]
    public void MassiveDiracConeGivesMinusSignOfMassHalfQuantum(double m)
    {
        const double v = 1;
        var cone = new TopologyModels.MassiveDirac(v, m);
        var g = new BandGeometry(cone, new VelocityOperator(cone));
        // Kubo curvature of the lower band against the closed form, at a few points.
        foreach (var k in new[] { new Vec3(0.05, 0.02, 0), new Vec3(-0.3, 0.1, 0), new Vec3(1.0, -2.0, 0) })
        {
            g.Compute(k);
            double e = Math.Sqrt(v * v * (k.X * k.X + k.Y * k.Y) + m * m);
            Assert.Equal(m * v * v / (2 * e * e * e), g.Curvatures[2], 1e-6 * Math.Abs(m * v * v / (2 * e * e * e)));
        }
        // sigma over the disc theta < theta_K by Simpson's rule in theta (the radial Jacobian absorbed), in e^2/h.
        double thetaK = Math.Atan(1000.0), sum = 0;
        const int steps = 400;
        for (int i = 0; i <= steps; i++)
        {
            double th = thetaK * i / steps, kr = Math.Abs(m) * Math.Tan(th) / v;
            g.Compute(new Vec3(kr * Math.Cos(0.3), kr * Math.Sin(0.3), 0));
            // d^2k = 2 pi k dk, k dk = (m^2 / v^2) tan(th) sec^2(th) d th.
            double integrand = 2 * Math.PI * g.Curvatures[2] * (m * m / (v * v)) * Math.Tan(th) / (Math.Cos(th) * Math.Cos(th));
            sum += integrand * (i == 0 || i == steps ? 1 : i % 2 == 1 ? 4 : 2);
        }
        double integral = sum * thetaK / steps / 3 / (4 * Math.PI * Math.PI);
        double sigmaInQuantum = -2 * Math.PI * integral;           // -(e^2/hbar) x integral, in units of e^2/h
        Assert.Equal(-Math.Sign(m) * 0.5 * (1 - Math.Cos(thetaK)), sigmaInQuantum, 6);
        Assert.Equal(-Math.Sign(m) * 0.5, sigmaInQuantum, 2);
    }
}
