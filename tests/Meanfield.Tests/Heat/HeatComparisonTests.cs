using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class HeatComparisonTests
{
    // A flat DOS of 1 state/eV per formula unit predicts gamma = 2.35714 mJ mol^-1 K^-2 (Ashcroft & Mermin ch. 2; see
    // QuasiparticleHeatTests). "Measured" data built as 70 x that (an invented mass enhancement) must give a gamma
    // ratio of 70 and a constant relative residual of 69; the power law of a linear C has alpha = 1.
    [Fact]
    public void ComparisonReportsGammaRatioAndResiduals()
    {
        var e = Enumerable.Range(0, 9).Select(i => -1 + 0.25 * i).ToArray();
        var dos = QuasiparticleHeatTests.Build(e, e.Select(_ => 1.0).ToArray(), 0.1, EnergyUnit.ElectronVolt);
        var t = Enumerable.Range(1, 20).Select(i => 0.5 * i).ToArray();
        var predicted = new QuasiparticleHeat(dos).Curve(t);
        var tm = new[] { 0.7, 1.3, 2.9, 4.4, 6.1, 12 };
        var measured = new HeatCurve(tm, tm.Select(x => 70 * 2.35714e-3 * x).ToArray());
        var cmp = HeatComparison.Compare(predicted, measured, 0.5, 8);
        Assert.Equal(2.35714, cmp.PredictedSommerfeld.GammaMilli, 1e-5);
        Assert.Equal(70, cmp.GammaRatio, 1e-4);
        Assert.Equal(1.0, cmp.PredictedPowerLaw.Exponent, 1e-6);
        Assert.Equal(1.0, cmp.MeasuredPowerLaw.Exponent, 1e-6);
        Assert.Equal(5, cmp.Residuals.Count); // 12 K is outside the window
        Assert.All(cmp.Residuals, r => Assert.Equal(69, r.Relative, 1e-3));
    }
}
