using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class SchottkyHeatTests
{
    // Two levels of equal degeneracy: maximum C = 0.439229 N k_B at T = 0.416778 Delta (Gopal, Specific Heats at
    // Low Temperatures (1966), ch. 3; values from memory, to six digits).
    [Fact]
    public void SchottkyMaximumHasTheTextbookHeightAndPosition()
    {
        var (tMax, cMax) = Maximise(t => SchottkyHeat.PerSystem(1.0, t), 0.2, 0.8);
        Assert.Equal(0.416778, tMax, 2e-6);
        Assert.Equal(0.439229, cMax, 2e-6);
    }

    // A DOS of two narrow peaks (one state each) at mu +- delta with one electron: each level is an independent
    // empty/occupied two-level system split by delta, so C = 2 x Schottky(delta) and, by symmetry, mu stays at the
    // centre. The peak sits at T = 0.416778 delta with height 2 x 0.439229 (Gopal 1966, as above).
    [Fact]
    public void TwoNarrowPeaksGiveTwiceTheSchottkyAnomaly()
    {
        double delta = 2.0, w = 1e-4; // meV; triangle half-width w << T
        double[] e = [-delta - w, -delta, -delta + w, delta - w, delta, delta + w];
        double[] rho = [0, 1 / w, 0, 0, 1 / w, 0];
        // Half filling of the tabulated states (the grid rounds each peak's weight to 1 +- 1e-12).
        double half = 0.5 * new TabulatedDos(e, rho, 1.0).TotalStates;
        var heat = new QuasiparticleHeat(new TabulatedDos(e, rho, half, EnergyUnit.MilliElectronVolt));
        double k = EnergyUnit.MilliElectronVolt.Kelvins();
        foreach (double t in new[] { 0.1, 0.3, 0.416778, 0.8, 2.0 })
        {
            var p = heat.At(t * delta * k);
            double expected = 2 * SchottkyHeat.PerSystem(delta, t * delta);
            Assert.Equal(expected, p.HeatCapacityPerCell, Math.Max(1e-7 * expected, 1e-14));
            Assert.Equal(0, p.ChemicalPotential, 1e-9);
        }
        var (tMax, cMax) = Maximise(t => heat.At(t * delta * k).HeatCapacityPerCell, 0.2, 0.8);
        Assert.Equal(0.416778, tMax, 2e-5);
        Assert.Equal(2 * 0.439229, cMax, 4e-6);
    }

    private static (double x, double y) Maximise(Func<double, double> g, double a, double b)
    {
        double r = (Math.Sqrt(5) - 1) / 2;
        double c = b - r * (b - a), d = a + r * (b - a);
        while (b - a > 1e-9)
        {
            if (g(c) > g(d)) { b = d; d = c; c = b - r * (b - a); }
            else { a = c; c = d; d = a + r * (b - a); }
        }
        double x = 0.5 * (a + b);
        return (x, g(x));
    }
}
