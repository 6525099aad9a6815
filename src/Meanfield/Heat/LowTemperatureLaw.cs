namespace Meanfield.Heat;

/// <summary>How <see cref="LowTemperatureLaw.SelectWindow"/> judges whether C/T = gamma + beta T^2 still holds.</summary>
public enum WindowCriterion
{
    /// <summary>Weighted chi^2/(n-2) at or below the threshold (needs uncertainties).</summary>
    ReducedChiSquare,
    /// <summary>Largest |C/T - fit| / fit at or below the threshold (a fraction, 0.01 = 1 %).</summary>
    MaxRelativeDeviation,
}

/// <summary>Where the low-temperature law C/T = gamma + beta T^2 holds: window selection and the departure temperature.</summary>
public static class LowTemperatureLaw
{
    /// <summary>
    /// The largest window starting at the lowest temperature at or above <paramref name="windowMinK"/> whose Sommerfeld
    /// fit meets <paramref name="criterion"/> &lt;= <paramref name="threshold"/>. Every window of 3 or more points is
    /// tried and the widest that passes wins (a noisy narrow window failing does not end the search).
    /// </summary>
    /// <exception cref="ArgumentException">Selection by reduced chi^2 of a curve without uncertainties.</exception>
    /// <exception cref="RequestError">Fewer than 3 points from <paramref name="windowMinK"/>, or no window passes.</exception>
    public static SommerfeldFit SelectWindow(HeatCurve curve, WindowCriterion criterion, double threshold,
                                             double windowMinK = 0)
    {
        if (criterion == WindowCriterion.ReducedChiSquare && curve.Sigma is null)
            throw new ArgumentException("window selection by reduced chi^2 needs uncertainties of C");
        int first = 0;
        while (first < curve.Count && curve.TemperaturesK[first] < windowMinK) first++;
        int available = curve.Count - first;
        if (available < 3)
            throw new RequestError(
                $"window selection needs at least 3 points at or above {windowMinK} K (two-parameter fit); found {available}");
        SommerfeldFit? best = null;
        for (int last = first + 2; last < curve.Count; last++)
        {
            var fit = SommerfeldFit.Fit(curve, curve.TemperaturesK[first], curve.TemperaturesK[last]);
            double score = criterion == WindowCriterion.ReducedChiSquare ? fit.ReducedChiSquare : fit.MaxRelativeDeviation;
            if (score <= threshold) best = fit;
        }
        return best ?? throw new RequestError(
            $"no window from {curve.TemperaturesK[first]} K meets {criterion} <= {threshold}");
    }

    /// <summary>
    /// The lowest temperature (K) from which C/T deviates from <paramref name="fit"/> by more than
    /// <paramref name="percent"/> % at <paramref name="consecutive"/> successive points (use more than one on noisy data),
    /// or null when it never does within the curve.
    /// </summary>
    public static double? DepartureTemperature(HeatCurve curve, SommerfeldFit fit, double percent, int consecutive = 1)
    {
        if (!(percent > 0)) throw new ArgumentOutOfRangeException(nameof(percent), "the deviation threshold must be positive");
        if (consecutive < 1) throw new ArgumentOutOfRangeException(nameof(consecutive));
        int run = 0;
        for (int i = 0; i < curve.Count; i++)
        {
            double t = curve.TemperaturesK[i], law = fit.COverT(t);
            bool off = Math.Abs(curve.MolarHeat[i] / t - law) > 0.01 * percent * Math.Abs(law);
            run = off ? run + 1 : 0;
            if (run == consecutive) return curve.TemperaturesK[i - consecutive + 1];
        }
        return null;
    }
}
