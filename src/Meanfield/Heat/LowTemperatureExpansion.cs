using MathNet.Numerics.LinearAlgebra;

namespace Meanfield.Heat;

/// <summary>
/// The low-temperature expansion C/T = gamma + beta T^2 + delta T^4 fitted by linear least squares in T^2 over a
/// window (the Sommerfeld term, the T^3 term of cones or phonons and the next order of either; Ashcroft &amp; Mermin,
/// Solid State Physics (1976), ch. 2 and 23; the T^4 term in C/T is common practice). Per mole of formula units:
/// gamma in J mol^-1 K^-2, beta in J mol^-1 K^-4, delta in J mol^-1 K^-6.
/// </summary>
/// <remarks>
/// Why a third term: a computed curve has no noise, so a two-term fit to a curve that bends (C/T^3 of a cone rises with
/// T as the bands curve) biases gamma by about -delta X^2/6 over a window up to T^2 = X, while its residual-based error
/// is several times smaller: gamma would come out negative "beyond its error". The errors here therefore add to the
/// statistical error (from the weights, or from the residual scatter without them) the truncation error: the change of
/// each coefficient when the next power (T^6 in C/T) is added, when the window holds enough points.
/// </remarks>
/// <param name="Gamma">Sommerfeld coefficient (J mol^-1 K^-2).</param>
/// <param name="GammaError">One-sigma error, statistical and truncation in quadrature.</param>
/// <param name="Beta">T^3 coefficient of C (J mol^-1 K^-4).</param>
/// <param name="BetaError">One-sigma error, as for gamma.</param>
/// <param name="Delta">T^5 coefficient of C (J mol^-1 K^-6); 0 for a two-term fit.</param>
/// <param name="DeltaError">One-sigma error of delta.</param>
/// <param name="WindowMinK">Lowest temperature used (K).</param>
/// <param name="WindowMaxK">Highest temperature used (K).</param>
/// <param name="Points">Points in the window.</param>
/// <param name="Terms">2 (gamma, beta) or 3 (gamma, beta, delta).</param>
/// <param name="MaxRelativeDeviation">Largest |C/T - fit| / fit over the window.</param>
public sealed record LowTemperatureExpansion(double Gamma, double GammaError, double Beta, double BetaError,
                                             double Delta, double DeltaError, double WindowMinK, double WindowMaxK,
                                             int Points, int Terms, double MaxRelativeDeviation)
{
    /// <summary>Default largest relative deviation of an automatically chosen window (0.5 %).</summary>
    public const double DefaultWindowTolerance = 0.005;

    /// <summary>gamma in mJ mol^-1 K^-2.</summary>
    public double GammaMilli => 1e3 * Gamma;

    /// <summary>Fitted C/T (J mol^-1 K^-2) at <paramref name="temperatureK"/>.</summary>
    public double COverT(double temperatureK)
    {
        double x = temperatureK * temperatureK;
        return Gamma + x * (Beta + x * Delta);
    }

    /// <summary>The leading law gamma + beta T^2 (J mol^-1 K^-2), without the delta term.</summary>
    public double LeadingCOverT(double temperatureK) => Gamma + Beta * temperatureK * temperatureK;

    /// <summary>
    /// Fit over the points with <paramref name="windowMinK"/> &lt;= T &lt;= <paramref name="windowMaxK"/> (K): three
    /// terms when the window holds at least 4 points and <paramref name="terms"/> is 3, else two (at least 3 points).
    /// </summary>
    /// <exception cref="RequestError">The window holds fewer than 3 points.</exception>
    /// <exception cref="ArgumentException"><paramref name="terms"/> is not 2 or 3.</exception>
    public static LowTemperatureExpansion Fit(HeatCurve curve, double windowMinK = 0,
                                              double windowMaxK = double.PositiveInfinity, int terms = 3)
    {
        if (terms is not (2 or 3)) throw new ArgumentException($"terms = {terms}: the expansion has 2 or 3 terms");
        var (x, y, s, lo, hi) = Select(curve, windowMinK, windowMaxK);
        if (x.Length < 3)
            throw new RequestError(
                $"the fit C/T = gamma + beta T^2 has two parameters and needs at least 3 points in its window; " +
                $"the window [{windowMinK}, {windowMaxK}] K holds {x.Length}");
        int p = terms == 3 && x.Length >= 4 ? 3 : 2;
        var (c, err) = Solve(x, y, s, p);
        var truncation = new double[p];
        if (x.Length >= p + 2)
        {
            var (next, _) = Solve(x, y, s, p + 1);
            for (int i = 0; i < p; i++) truncation[i] = Math.Abs(next[i] - c[i]);
        }
        double E(int i) => i < p ? Math.Sqrt(err[i] * err[i] + truncation[i] * truncation[i]) : 0;
        double maxDev = 0;
        for (int i = 0; i < x.Length; i++)
        {
            double model = c[0] + x[i] * (c[1] + x[i] * (p == 3 ? c[2] : 0));
            maxDev = Math.Max(maxDev, Math.Abs(y[i] - model) / Math.Abs(model));
        }
        return new LowTemperatureExpansion(c[0], E(0), c[1], E(1), p == 3 ? c[2] : 0, E(2), lo, hi, x.Length, p, maxDev);
    }

    /// <summary>
    /// The widest window from the lowest temperature of <paramref name="curve"/> whose three-term fit deviates from the
    /// curve by at most <paramref name="tolerance"/> (fraction); the lowest 4 points when none does.
    /// <see cref="ArgumentException"/> for fewer than 3 points.
    /// </summary>
    public static LowTemperatureExpansion SelectWindow(HeatCurve curve, double tolerance = DefaultWindowTolerance)
    {
        if (curve.Count < 3) throw new ArgumentException($"a window needs at least 3 points; the curve has {curve.Count}");
        LowTemperatureExpansion? best = null;
        for (int last = Math.Min(3, curve.Count - 1); last < curve.Count; last++)
        {
            var fit = Fit(curve, curve.TemperaturesK[0], curve.TemperaturesK[last]);
            if (fit.MaxRelativeDeviation <= tolerance) best = fit;
        }
        return best ?? Fit(curve, curve.TemperaturesK[0], curve.TemperaturesK[Math.Min(3, curve.Count - 1)]);
    }

    /// <summary>
    /// The lowest temperature (K) from which C/T of <paramref name="curve"/> differs from the leading law
    /// gamma + beta T^2 by more than <paramref name="percent"/> % (for a pinned semimetal: where C leaves the T^3 law),
    /// or null when it never does.
    /// </summary>
    public double? DepartureTemperature(HeatCurve curve, double percent)
    {
        if (!(percent > 0)) throw new ArgumentOutOfRangeException(nameof(percent), "the deviation threshold must be positive");
        for (int i = 0; i < curve.Count; i++)
        {
            double t = curve.TemperaturesK[i], law = LeadingCOverT(t);
            if (Math.Abs(curve.MolarHeat[i] / t - law) > 0.01 * percent * Math.Abs(law)) return t;
        }
        return null;
    }

    private static (double[] X, double[] Y, double[]? S, double Lo, double Hi) Select(HeatCurve curve, double lo, double hi)
    {
        var x = new List<double>(); var y = new List<double>();
        var s = curve.Sigma is null ? null : new List<double>();
        double first = double.NaN, last = double.NaN;
        for (int i = 0; i < curve.Count; i++)
        {
            double t = curve.TemperaturesK[i];
            if (t < lo || t > hi) continue;
            if (double.IsNaN(first)) first = t;
            last = t;
            x.Add(t * t); y.Add(curve.MolarHeat[i] / t); s?.Add(curve.Sigma![i] / t);
        }
        return (x.ToArray(), y.ToArray(), s?.ToArray(), first, last);
    }

    // Weighted (or unweighted) least squares in powers of x = T^2, scaled by the window's largest x for conditioning.
    // Errors: sqrt(diag (A^T W A)^-1) with weights, times the residual scatter without them.
    private static (double[] Coefficients, double[] Errors) Solve(double[] x, double[] y, double[]? s, int p)
    {
        int n = x.Length;
        double scale = x.Max();
        var a = Matrix<double>.Build.Dense(n, p);
        var b = Vector<double>.Build.Dense(n);
        for (int i = 0; i < n; i++)
        {
            double w = s is null ? 1 : 1 / s[i], u = x[i] / scale, pow = 1;
            for (int j = 0; j < p; j++) { a[i, j] = w * pow; pow *= u; }
            b[i] = w * y[i];
        }
        var qr = a.QR();
        var c = qr.Solve(b);
        var r = a * c - b;
        double rss = r * r;
        var cov = (a.TransposeThisAndMultiply(a)).Inverse();
        double factor = s is null ? (n > p ? rss / (n - p) : 0) : 1;
        var coef = new double[p];
        var err = new double[p];
        for (int j = 0; j < p; j++)
        {
            double unscale = Math.Pow(scale, -j);
            coef[j] = c[j] * unscale;
            err[j] = Math.Sqrt(Math.Max(cov[j, j] * factor, 0)) * unscale;
        }
        return (coef, err);
    }
}
