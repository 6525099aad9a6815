using Meanfield.Heat;
using MathNet.Numerics.Random;

namespace Meanfield.Tests.Heat;

public class FitTests
{
    private static double Normal(Random rng) =>
        Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());

    private static HeatCurve Synthetic(double gamma, double beta, double relNoise, int seed, int n = 40, double tMax = 8)
    {
        var rng = new MersenneTwister(seed);
        var t = Enumerable.Range(1, n).Select(i => tMax * i / n).ToArray();
        var exact = t.Select(x => (gamma + beta * x * x) * x).ToArray();
        var c = exact.Select(x => x * (1 + relNoise * Normal(rng))).ToArray();
        return new HeatCurve(t, c, exact.Select(x => relNoise * x).ToArray());
    }

    // Round trip: C/T = gamma + beta T^2 with known Gaussian noise; the weighted least-squares standard errors
    // (Press et al., Numerical Recipes 3rd ed. (2007), sec. 15.2) must cover the truth: about 68 % of 400 fits within
    // one sigma (binomial spread +-2.3 %), and every fit within 5 sigma.
    [Fact]
    public void SommerfeldFitRecoversParametersWithinReportedErrors()
    {
        double gamma = 0.18, beta = 1.2e-3;
        int inGamma = 0, inBeta = 0, runs = 400;
        for (int s = 0; s < runs; s++)
        {
            var fit = SommerfeldFit.Fit(Synthetic(gamma, beta, 0.03, s), 0, 6);
            Assert.True(fit.Weighted);
            Assert.InRange(Math.Abs(fit.Gamma - gamma), 0, 5 * fit.GammaError);
            Assert.InRange(Math.Abs(fit.Beta - beta), 0, 5 * fit.BetaError);
            if (Math.Abs(fit.Gamma - gamma) < fit.GammaError) inGamma++;
            if (Math.Abs(fit.Beta - beta) < fit.BetaError) inBeta++;
        }
        Assert.InRange(inGamma / (double)runs, 0.61, 0.75);
        Assert.InRange(inBeta / (double)runs, 0.61, 0.75);
    }

    // Unweighted fit: standard errors from the residual scatter must cover the truth the same way.
    [Fact]
    public void UnweightedSommerfeldFitErrorsComeFromScatter()
    {
        int inside = 0, runs = 300;
        for (int s = 0; s < runs; s++)
        {
            var fit = SommerfeldFit.Fit(Synthetic(0.05, 2e-3, 0.01, 1000 + s).WithSigma(null));
            Assert.False(fit.Weighted);
            if (Math.Abs(fit.Gamma - 0.05) < fit.GammaError) inside++;
        }
        Assert.InRange(inside / (double)runs, 0.58, 0.78);
    }

    // Exact data: noise-free gamma + beta T^2 is reproduced to rounding (the check that the fit form is right).
    [Fact]
    public void ExactSommerfeldDataIsReproduced()
    {
        var t = new[] { 0.5, 1.0, 2.0, 3.0 };
        var fit = SommerfeldFit.Fit(new HeatCurve(t, t.Select(x => 0.3 * x + 0.002 * x * x * x).ToArray()));
        Assert.Equal(0.3, fit.Gamma, 1e-13);
        Assert.Equal(0.002, fit.Beta, 1e-14);
        Assert.Equal(300, fit.GammaMilli, 1e-10);
    }

    [Fact]
    public void TooFewPointsInWindowIsAnArgumentErrorSayingHowManyAreNeeded()
    {
        var curve = Synthetic(0.1, 1e-3, 0.01, 7);
        var ex = Assert.Throws<RequestError>(() => SommerfeldFit.Fit(curve, 0, 0.45));
        Assert.Contains("at least 3 points", ex.Message);
        Assert.Contains("holds 2", ex.Message);
        var ex2 = Assert.Throws<RequestError>(() => PowerLawFit.Fit(curve, 7.9, 10));
        Assert.Contains("at least 3 points", ex2.Message);
    }

    // Power law C = A T^alpha with 2 % noise: alpha recovered within its standard error times 4; noise-free exact.
    [Fact]
    public void PowerLawFitRecoversExponent()
    {
        var t = Enumerable.Range(1, 30).Select(i => 0.2 * i).ToArray();
        var exact = new HeatCurve(t, t.Select(x => 0.7 * Math.Pow(x, 2.6)).ToArray());
        var fit = PowerLawFit.Fit(exact);
        Assert.Equal(2.6, fit.Exponent, 1e-12);
        Assert.Equal(0.7, fit.Amplitude, 1e-12);
        var rng = new MersenneTwister(3);
        var noisy = new HeatCurve(t, t.Select(x => 0.7 * Math.Pow(x, 2.6) * (1 + 0.02 * Normal(rng))).ToArray());
        var nf = PowerLawFit.Fit(noisy);
        Assert.InRange(Math.Abs(nf.Exponent - 2.6), 0, 4 * nf.ExponentError);
        Assert.InRange(nf.ExponentError, 0.002, 0.02); // sigma_alpha ~ 0.02/sqrt(sum (lnT - <lnT>)^2) ~ 0.005
    }

    // Departure from the low-T law: C/T = gamma + beta T^2 + d T^4; the relative deviation d T^4/(gamma + beta T^2)
    // first exceeds 5 % at the root of d T^4 = 0.05 (gamma + beta T^2) (algebra).
    [Fact]
    public void DepartureTemperatureIsWhereTheQuarticTermReachesTheThreshold()
    {
        double g = 0.1, b = 1e-3, d = 2e-5;
        var t = Enumerable.Range(1, 400).Select(i => 0.025 * i).ToArray();
        var curve = new HeatCurve(t, t.Select(x => (g + b * x * x + d * Math.Pow(x, 4)) * x).ToArray());
        var lowFit = SommerfeldFit.Fit(new HeatCurve(t, t.Select(x => (g + b * x * x) * x).ToArray()));
        double y = (0.05 * b + Math.Sqrt(0.0025 * b * b + 4 * d * 0.05 * g)) / (2 * d); // T^2
        double? found = LowTemperatureLaw.DepartureTemperature(curve, lowFit, 5);
        Assert.NotNull(found);
        Assert.InRange(found!.Value - Math.Sqrt(y), 0, 0.025 + 1e-12);
        Assert.Null(LowTemperatureLaw.DepartureTemperature(curve, lowFit, 500));
    }

    // Automatic window: data follow the law up to ~4 K and then bend away; the selected window must stop near there.
    [Fact]
    public void AutomaticWindowStopsWhereTheLawFails()
    {
        var rng = new MersenneTwister(11);
        var t = Enumerable.Range(1, 80).Select(i => 0.1 * i).ToArray();
        double Exact(double x) => (0.2 + 1e-3 * x * x) * x + (x > 4 ? 0.02 * Math.Pow(x - 4, 2) * x : 0);
        var c = t.Select(x => Exact(x) * (1 + 0.005 * Normal(rng))).ToArray();
        var curve = new HeatCurve(t, c, t.Select(x => 0.005 * Exact(x)).ToArray());
        var byChi = LowTemperatureLaw.SelectWindow(curve, WindowCriterion.ReducedChiSquare, 1.5);
        Assert.InRange(byChi.WindowMaxK, 3.8, 5.0);
        Assert.Equal(0.2, byChi.Gamma, 4 * byChi.GammaError);
        var byDev = LowTemperatureLaw.SelectWindow(curve.WithSigma(null), WindowCriterion.MaxRelativeDeviation, 0.02);
        Assert.InRange(byDev.WindowMaxK, 3.8, 6.0);
        Assert.Throws<ArgumentException>(() =>
            LowTemperatureLaw.SelectWindow(curve.WithSigma(null), WindowCriterion.ReducedChiSquare, 1.5));
    }
}
