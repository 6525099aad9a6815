namespace Meanfield.Heat;

/// <summary>
/// Free power law C = A T^alpha fitted by linear least squares of ln C on ln T over a temperature window (common practice).
/// With uncertainties of C the weights use sigma(ln C) = sigma_C / C.
/// </summary>
/// <param name="Amplitude">A in J mol^-1 K^-(1+alpha).</param>
/// <param name="LnAmplitudeError">One-sigma error of ln A.</param>
/// <param name="Exponent">alpha.</param>
/// <param name="ExponentError">One-sigma error of alpha.</param>
/// <param name="WindowMinK">Lowest temperature used (K).</param>
/// <param name="WindowMaxK">Highest temperature used (K).</param>
/// <param name="Points">Points in the window.</param>
public sealed record PowerLawFit(double Amplitude, double LnAmplitudeError, double Exponent, double ExponentError,
                                 double WindowMinK, double WindowMaxK, int Points)
{
    /// <summary>Fitted C (J mol^-1 K^-1).</summary>
    public double MolarHeat(double temperatureK) => Amplitude * Math.Pow(temperatureK, Exponent);

    /// <summary>Fit ln C = ln A + alpha ln T over the points with window min &lt;= T &lt;= window max (K).</summary>
    /// <exception cref="RequestError">C &lt;= 0 in the window, or fewer than 3 points in it.</exception>
    public static PowerLawFit Fit(HeatCurve curve, double windowMinK = 0, double windowMaxK = double.PositiveInfinity)
    {
        var x = new List<double>();
        var y = new List<double>();
        var s = curve.Sigma is null ? null : new List<double>();
        double lo = double.NaN, hi = double.NaN;
        for (int i = 0; i < curve.Count; i++)
        {
            double t = curve.TemperaturesK[i], c = curve.MolarHeat[i];
            if (t < windowMinK || t > windowMaxK) continue;
            if (!(c > 0))
                throw new RequestError($"a power-law fit needs C > 0; C = {c} J mol^-1 K^-1 at T = {t} K");
            if (double.IsNaN(lo)) lo = t;
            hi = t;
            x.Add(Math.Log(t));
            y.Add(Math.Log(c));
            s?.Add(curve.Sigma![i] / c);
        }
        if (x.Count < 3)
            throw new RequestError(
                $"the power-law fit C = A T^alpha has two parameters and needs at least 3 points in its window; " +
                $"the window [{windowMinK}, {windowMaxK}] K holds {x.Count}");
        var line = StraightLineFit.Fit(x, y, s);
        return new PowerLawFit(Math.Exp(line.Intercept), line.InterceptError, line.Slope, line.SlopeError, lo, hi, line.Points);
    }
}
