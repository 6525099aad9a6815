using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

/// <summary>
/// The heat study on a narrow pair of tilted Weyl cones inside a spectrum ~350 times wider (TiltedWeylLattice with
/// remote bands): the numerical C(T) must reach the analytic T^3 law of the tilted cones,
/// C = 2 (7 pi^2/30) k_B^4 T^3 V_cell / (|det hbar v| (1 - w^2)^2) per cell (Ashcroft &amp; Mermin, Solid State Physics
/// (1976), app. C for Int x^4 e^x/(e^x+1)^2 dx = 7 pi^4/15; the tilt factor derived in TiltedConeTests), written here
/// from the model's own v = t a and w = c, not from the code's cone fit.
/// </summary>
public class HeatStudyTests
{
    private const double T = 10, A = 3, C = 0.6, Remote = 2000; // meV, angstrom, tilt, meV (invented)

    private static HeatStudyResult Run(double energyScale, double latticeScale, double temperatureScale)
    {
        var source = new TiltedWeylLattice(T * energyScale, A * latticeScale, C, Remote * energyScale);
        var request = new HeatStudyRequest
        {
            MinTemperatureK = 0.1 * temperatureScale, MaxTemperatureK = 1.0 * temperatureScale, Points = 6, Logarithmic = true, DosMesh = 8,
        };
        return HeatStudy.Run(source.Model, source, null, request);
    }

    // Analytic molar beta of the two tilted cones (J mol^-1 K^-4) for hopping t (meV): per cell
    // 2 (7 pi^2/30) a^3 / ((t a)^3 (1 - c^2)^2) k_B per meV^3, times R, over (K per meV)^3.
    private static double AnalyticBeta(double t)
    {
        double kelvinPerMeV = EnergyUnit.MilliElectronVolt.Kelvins();
        double perCell = 2 * 7 * Math.PI * Math.PI / 30 / (t * t * t * Math.Pow(1 - C * C, 2));
        return perCell * PhysicalConstants.GasConstant / Math.Pow(kelvinPerMeV, 3);
    }

    [Fact]
    public void NarrowTiltedConesReachTheTiltedT3LawWithZeroGamma_AndScaleFreely()
    {
        var r = Run(1, 1, 1);
        double beta = AnalyticBeta(T);
        // Two pinned type-I cones with the tilt of the model (cone fit: w = c, det = (t a)^3).
        Assert.NotNull(r.Nodes);
        Assert.Equal(2, r.Nodes!.Cones);
        Assert.Empty(r.Nodes.OffFermiLevel);
        Assert.Equal(1 / Math.Pow(1 - C * C, 2), r.Nodes.TiltFactor, 1e-3);
        Assert.Equal(beta, r.Nodes.MolarBeta, beta * 2e-3);
        // The T = 0 Fermi level of the compensated semimetal is the node energy 0 (electron count, common practice), to
        // far below k_B T_min (the mesh resolves energies down to a fraction of k_B T_min).
        double kTmin = 0.1 / EnergyUnit.MilliElectronVolt.Kelvins();
        Assert.InRange(Math.Abs(r.FermiLevel), 0, 0.01 * kTmin);
        // Numerical C/T^3 at 0.1 K (k_B T = 8.6e-4 t) and the fitted beta within 2 % of the analytic law.
        Assert.Equal(1, r.Curve.MolarHeat[0] / Math.Pow(r.Curve.TemperaturesK[0], 3) / beta, 0.02);
        Assert.Equal(1, r.Expansion.Beta / beta, 0.02);
        // A pinned semimetal has no Sommerfeld term: gamma is zero within its error, and that error (the mesh accuracy
        // of C carried through the fit) is a few per cent of C/T = beta T^2 at the lowest temperature.
        Assert.InRange(Math.Abs(r.Expansion.Gamma), 0, r.Expansion.GammaError);
        Assert.InRange(r.Expansion.GammaError, 0, 0.05 * beta * 0.1 * 0.1);

        // Every energy x1000 and the lattice constant x5: C per cell depends on k_B T / t only, so at 1000 times the
        // temperatures the molar C is the same, beta is 1e9 times smaller, the Fermi level scales with the energies
        // and hbar v* with t a (common practice: dimensional analysis).
        var s = Run(1000, 5, 1000);
        Assert.Equal(r.Curve.Count, s.Curve.Count);
        for (int i = 0; i < r.Curve.Count; i++) Assert.Equal(r.Curve.MolarHeat[i], s.Curve.MolarHeat[i], r.Curve.MolarHeat[i] * 1e-6);
        Assert.Equal(r.Expansion.Beta, 1e9 * s.Expansion.Beta, r.Expansion.Beta * 1e-6);
        Assert.Equal(r.FermiLevel * 1000, s.FermiLevel, 1e-6 * kTmin * 1000);
        Assert.Equal(r.Nodes.TiltFactor, s.Nodes!.TiltFactor, 1e-9);
        Assert.Equal(r.VelocityFromBeta!.HbarV * 5000, s.VelocityFromBeta!.HbarV, r.VelocityFromBeta.HbarV * 5000 * 1e-6);
        Assert.Equal(r.KPoints, s.KPoints);
    }

    // Over-tilted cones (w = c = 1.3 > 1, type II) carry electron and hole pockets at the node energy (Soluyanov et al.,
    // Nature 527, 495 (2015)): the study flags them, puts no T^3 node term, and the Fermi surface gives gamma > 0.
    [Fact]
    public void TypeTwoConesAreFlaggedAndGiveASommerfeldTerm()
    {
        var source = new TiltedWeylLattice(T, A, 1.3);
        var r = HeatStudy.Run(source.Model, source, null, new HeatStudyRequest
        {
            MinTemperatureK = 0.5, MaxTemperatureK = 5, Points = 5, Logarithmic = true, DosMesh = 16,
        });
        Assert.Equal(2, r.Nodes!.TypeII.Count);
        Assert.Equal(0, r.Nodes.Cones);
        Assert.Contains(r.Notes, n => n.Contains("type-II"));
        Assert.True(r.Expansion.Gamma > 5 * r.Expansion.GammaError, $"gamma {r.Expansion.Gamma} +- {r.Expansion.GammaError}");
    }
}
