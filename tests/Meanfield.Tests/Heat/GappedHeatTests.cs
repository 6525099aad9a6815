using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class GappedHeatTests
{
    // Flat bands rho0 for Delta < |E| < W, nothing inside, half filled: mu = 0 by particle-hole symmetry, so
    // C = (1/T) Int rho E^2 f(1-f) dE = 2 rho0 T Int_{Delta/T}^inf x^2 f(1-f) dx. For Delta >> T, f(1-f) = e^-x (1 + O(e^-x)):
    //   C = 2 rho0 T e^{-a} (a^2 + 2a + 2), a = Delta/T   (elementary integral Int x^2 e^-x = -e^-x (x^2 + 2x + 2)).
    // Leading term 2 rho0 Delta^2 e^{-Delta/T} / T: for a flat band edge C ~ T^-p e^{-Delta/T} with p = 1, so
    // ln(C T^p) = const - Delta/T + ln(1 + 2/a + 2/a^2), whose slope in 1/T is -Delta (1 + O((T/Delta)^2)).
    // (Activated behaviour of a gapped spectrum: Ashcroft & Mermin (1976), ch. 28 for the analogous semiconductor counts.)
    private const double Delta = 10, W = 100, Rho0 = 0.5; // meV, meV, states per cell per meV

    private static QuasiparticleHeat Gapped()
    {
        double eps = 1e-9 * Delta; // sharp edges
        double[] e = [-W, -Delta, -Delta + eps, Delta - eps, Delta, W];
        double[] rho = [Rho0, Rho0, 0, 0, Rho0, Rho0];
        double half = 0.5 * new TabulatedDos(e, rho, 1).TotalStates;
        return new QuasiparticleHeat(new TabulatedDos(e, rho, half, EnergyUnit.MilliElectronVolt));
    }

    private static readonly double[] InverseA = Enumerable.Range(0, 14).Select(i => 1.0 / (12 + i)).ToArray();

    [Fact]
    public void ActivatedHeatMatchesFlatEdgeAsymptotics()
    {
        var heat = Gapped();
        double k = EnergyUnit.MilliElectronVolt.Kelvins();
        foreach (double invA in InverseA)
        {
            double t = Delta * invA, a = 1 / invA;
            double expected = 2 * Rho0 * t * Math.Exp(-a) * (a * a + 2 * a + 2);
            var p = heat.At(t * k);
            Assert.Equal(expected, p.HeatCapacityPerCell, 2e-5 * expected);
            Assert.Equal(0, p.ChemicalPotential, 1e-9 * t);
        }
    }

    [Fact]
    public void SlopeOfLogCTimesTIsMinusDelta()
    {
        var heat = Gapped();
        double k = EnergyUnit.MilliElectronVolt.Kelvins();
        var u = InverseA.Select(i => 1 / (Delta * i)).ToArray(); // 1/T
        double[] Log(int p, bool corrected) => u.Select(x =>
        {
            double t = 1 / x, a = Delta * x;
            double c = heat.At(t * k).HeatCapacityPerCell;
            return Math.Log(c * Math.Pow(t, p) / (corrected ? 1 + 2 / a + 2 / (a * a) : 1));
        }).ToArray();
        double Slope(double[] y) => MathNet.Numerics.Fit.Line(u, y).B;
        Assert.Equal(-Delta, Slope(Log(1, corrected: true)), 1e-4 * Delta);
        Assert.Equal(-Delta, Slope(Log(1, corrected: false)), 0.02 * Delta);
        // With the wrong prefactor power (p = 0) the slope is off by about T ~ 6 %: the check can fail.
        Assert.True(Math.Abs(Slope(Log(0, corrected: false)) + Delta) > 0.04 * Delta);
    }
}
