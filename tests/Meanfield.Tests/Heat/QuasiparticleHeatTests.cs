using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class QuasiparticleHeatTests
{
    // A DOS built from grid values; N_e chosen as the states below e0 of the tabulated (linear) DOS, so the T = 0
    // Fermi level is exactly e0.
    internal static TabulatedDos Build(double[] e, double[] rho, double e0, EnergyUnit unit, double formulaUnits = 1)
    {
        double ne = new TabulatedDos(e, rho, 0.5 * Trapezoid(e, rho)).StatesBelow(e0);
        return new TabulatedDos(e, rho, ne, unit, formulaUnits);
    }

    private static double Trapezoid(double[] e, double[] rho)
    {
        double s = 0;
        for (int i = 1; i < e.Length; i++) s += 0.5 * (rho[i] + rho[i - 1]) * (e[i] - e[i - 1]);
        return s;
    }

    private static double[] Grid(double a, double b, int n) =>
        Enumerable.Range(0, n).Select(i => a + (b - a) * i / (n - 1)).ToArray();

    // Sommerfeld: C/T -> gamma = (pi^2/3) k_B^2 rho(E_F) (Ashcroft & Mermin, Solid State Physics (1976), ch. 2, eq. 2.80).
    // 1 state/eV per formula unit gives gamma = (pi^2/3) k_B^2 N_A / eV = 2.35714 mJ mol^-1 K^-2 (derived here from the
    // CODATA 2018 constants). Grid spacing 0.25 eV >> T.
    [Theory]
    [InlineData(1.0)]
    [InlineData(0.01)]
    public void FlatDosGivesSommerfeldGammaEvenWhenTIsFarBelowGridSpacing(double temperatureK)
    {
        var e = Grid(-1, 1, 9);
        var dos = Build(e, e.Select(_ => 1.0).ToArray(), 0.1, EnergyUnit.ElectronVolt);
        var p = new QuasiparticleHeat(dos).At(temperatureK);
        double kB = PhysicalConstants.Boltzmann;
        double gamma = Math.PI * Math.PI / 3 * kB * kB * PhysicalConstants.Avogadro / PhysicalConstants.ElementaryCharge;
        Assert.Equal(2.35714e-3, gamma, 1e-8);
        Assert.Equal(gamma, p.MolarHeatCapacity / temperatureK, gamma * 1e-6);
        Assert.Equal(2.35714, p.MolarCOverTMilli, 1e-5);
        // S = gamma T in the linear regime (integrate C/T from 0).
        Assert.Equal(gamma * temperatureK, p.MolarEntropy, gamma * temperatureK * 1e-6);
        Assert.Equal(0.1, p.ChemicalPotential, 1e-12);
    }

    // Per mole of formula units: two formula units per cell halve the molar value (definition of the unit).
    [Fact]
    public void MolarValuesArePerFormulaUnit()
    {
        var e = Grid(-1, 1, 9);
        var one = new QuasiparticleHeat(Build(e, e.Select(_ => 2.0).ToArray(), 0.1, EnergyUnit.ElectronVolt, 1)).At(2);
        var two = new QuasiparticleHeat(Build(e, e.Select(_ => 2.0).ToArray(), 0.1, EnergyUnit.ElectronVolt, 2)).At(2);
        Assert.Equal(one.MolarHeatCapacity / 2, two.MolarHeatCapacity, 1e-15);
        Assert.Equal(2 * 2.35714, one.MolarCOverTMilli, 2e-5);
        Assert.Equal(2.35714, two.MolarCOverTMilli, 1e-5);
    }

    // Linear DOS rho = 1 + bE at fixed N: the Sommerfeld expansion terminates (Ashcroft & Mermin ch. 2, eqs. 2.70-2.77),
    // N = Int^mu rho + (pi^2/6) T^2 b and U = Int^mu E rho + (pi^2/6) T^2 (1 + 2 b mu), exactly (up to e^-W/T). Hence
    // mu + b mu^2/2 = -(pi^2/6) b T^2, mu' = -(pi^2/3) b T / (1 + b mu), C = (pi^2/3) T (1 + b mu) + (pi^2/3) b T^2 mu'.
    [Fact]
    public void LinearDosFollowsTheTerminatingSommerfeldExpansion()
    {
        double b = 0.004; // 1/meV
        var e = Grid(-100, 100, 21);
        var heat = new QuasiparticleHeat(Build(e, e.Select(x => 1.0 + b * x).ToArray(), 0.0, EnergyUnit.MilliElectronVolt));
        double k = EnergyUnit.MilliElectronVolt.Kelvins(), z = Math.PI * Math.PI;
        foreach (double t in new[] { 0.05, 1.0, 3.0 }) // meV; the grid edges lie at least 33 T from mu
        {
            var p = heat.At(t * k);
            double mu = (-1 + Math.Sqrt(1 - 2 * b * (z / 6) * b * t * t)) / b;
            double slope = -(z / 3) * b * t / (1 + b * mu);
            double c = (z / 3) * t * (1 + b * mu) + (z / 3) * b * t * t * slope;
            Assert.Equal(mu, p.ChemicalPotential, 1e-11);
            Assert.Equal(slope, p.ChemicalPotentialSlope, 1e-11);
            Assert.Equal(c, p.HeatCapacityPerCell, 1e-10 * c);
        }
    }

    // C = T (dS/dT) at fixed N (Landau & Lifshitz, Statistical Physics Part 1 (1980), sec. 16): the mu'(T) term in C
    // is what makes this identity hold for a DOS without particle-hole symmetry.
    [Fact]
    public void HeatCapacityIsTTimesEntropySlope()
    {
        var e = Grid(-20, 20, 41);
        var rho = e.Select(x => 1.5 + 0.8 * Math.Sin(0.7 * x) + 0.02 * x).ToArray();
        var heat = new QuasiparticleHeat(Build(e, rho, 1.3, EnergyUnit.MilliElectronVolt));
        double t = 20, h = 1e-3;
        double dSdT = (heat.At(t + h).EntropyPerCell - heat.At(t - h).EntropyPerCell) / (2 * h);
        double c = heat.At(t).HeatCapacityPerCell;
        Assert.Equal(t * dSdT, c, 1e-6 * c);
        // Without the mu' term (the fixed-mu form (1/T^2) Int rho (E-mu)^2 f(1-f)) the identity fails visibly.
        var p = heat.At(t);
        Assert.True(Math.Abs(p.ChemicalPotentialSlope) > 1e-3);
    }

    // Weyl node: rho(E) = V E^2 / (2 pi^2 (hbar v)^3) per cell gives C = (7 pi^4/15) c T^3 with c = V/(2 pi^2 (hbar v)^3),
    // i.e. (7 pi^2/30) T^3 V / (hbar v)^3: the closed form of NodeHeat (derived in NodeHeat's remarks; integral from Ashcroft &
    // Mermin app. C). Checked against the tabulated-DOS engine on a grid of spacing T/40.
    [Theory]
    [InlineData(2.0)]
    [InlineData(6.0)]
    public void QuadraticDosMatchesIsotropicNodeFormula(double temperatureK)
    {
        double hbarV = 50, volume = 100; // meV angstrom, angstrom^3
        double t = temperatureK / EnergyUnit.MilliElectronVolt.Kelvins();
        double c = volume / (2 * Math.PI * Math.PI * Math.Pow(hbarV, 3));
        double w = 60 * t;
        var e = Grid(-w, w, 4801);
        var dos = Build(e, e.Select(x => c * x * x).ToArray(), 0.0, EnergyUnit.MilliElectronVolt, 2);
        var p = new QuasiparticleHeat(dos).At(temperatureK);
        Assert.Equal(7 * Math.Pow(Math.PI, 4) / 15 * c * t * t * t, p.HeatCapacityPerCell, 1e-4 * p.HeatCapacityPerCell);
        var node = new NodeHeat(EnergyUnit.MilliElectronVolt, volume, 2);
        double expected = node.MolarHeat(temperatureK, Math.Pow(hbarV, 3));
        Assert.Equal(expected, p.MolarHeatCapacity, 1e-4 * expected);
    }
}
