namespace Meanfield.Heat;

/// <summary>
/// Low-temperature law C/T = gamma + beta T^2 fitted by least squares on C/T against T^2 over a temperature window
/// (Sommerfeld electronic term plus a T^3 term from phonons and/or linear nodes; Ashcroft &amp; Mermin (1976), ch. 2 and 23).
/// Units: gamma in J mol^-1 K^-2, beta in J mol^-1 K^-4, per mole of formula units.
/// </summary>
/// <param name="Gamma">Sommerfeld coefficient (J mol^-1 K^-2).</param>
/// <param name="GammaError">Its one-sigma standard error.</param>
/// <param name="Beta">T^3 coefficient (J mol^-1 K^-4).</param>
/// <param name="BetaError">Its one-sigma standard error.</param>
/// <param name="GammaBetaCovariance">Covariance of gamma and beta.</param>
/// <param name="WindowMinK">Lowest temperature used (K).</param>
/// <param name="WindowMaxK">Highest temperature used (K).</param>
/// <param name="Points">Points in the window.</param>
/// <param name="Weighted">True when the curve's uncertainties weighted the fit (then errors are absolute).</param>
/// <param name="ReducedChiSquare">chi^2/(n-2) with weights; the residual variance of C/T otherwise.</param>
/// <param name="MaxRelativeDeviation">Largest |C/T - fit| / fit over the window.</param>
public sealed record SommerfeldFit(double Gamma, double GammaError, double Beta, double BetaError,
                                   double GammaBetaCovariance, double WindowMinK, double WindowMaxK, int Points,
                                   bool Weighted, double ReducedChiSquare, double MaxRelativeDeviation)
{
    /// <summary>gamma in mJ mol^-1 K^-2, the unit it is usually quoted in.</summary>
    public double GammaMilli => 1e3 * Gamma;

    /// <summary>Fitted C/T (J mol^-1 K^-2) at <paramref name="temperatureK"/>.</summary>
    public double COverT(double temperatureK) => Gamma + Beta * temperatureK * temperatureK;

    /// <summary>Fit <paramref name="curve"/> over the points with window min &lt;= T &lt;= window max (K).</summary>
    /// <exception cref="RequestError">Fewer than 3 points in the window.</exception>
    public static SommerfeldFit Fit(HeatCurve curve, double windowMinK = 0, double windowMaxK = double.PositiveInfinity)
    {
        var (x, y, s, tLo, tHi) = Select(curve, windowMinK, windowMaxK);
        var line = StraightLineFit.Fit(x, y, s);
        double maxDev = 0;
        for (int i = 0; i < x.Count; i++)
        {
            double model = line.Intercept + line.Slope * x[i];
            maxDev = Math.Max(maxDev, Math.Abs(y[i] - model) / Math.Abs(model));
        }
        return new SommerfeldFit(line.Intercept, line.InterceptError, line.Slope, line.SlopeError, line.Covariance,
                                 tLo, tHi, line.Points, s is not null, line.ReducedChiSquare, maxDev);
    }

    private static (List<double> x, List<double> y, List<double>? s, double lo, double hi) Select(
        HeatCurve curve, double windowMinK, double windowMaxK)
    {
        var x = new List<double>();
        var y = new List<double>();
        var s = curve.Sigma is null ? null : new List<double>();
        double lo = double.NaN, hi = double.NaN;
        for (int i = 0; i < curve.Count; i++)
        {
            double t = curve.TemperaturesK[i];
            if (t < windowMinK || t > windowMaxK) continue;
            if (double.IsNaN(lo)) lo = t;
            hi = t;
            x.Add(t * t);
            y.Add(curve.MolarHeat[i] / t);
            s?.Add(curve.Sigma![i] / t);
        }
        if (x.Count < 3)
            throw new RequestError(
                $"the Sommerfeld fit C/T = gamma + beta T^2 has two parameters and needs at least 3 points in its window; " +
                $"the window [{windowMinK}, {windowMaxK}] K holds {x.Count}");
        return (x, y, s, lo, hi);
    }
}
