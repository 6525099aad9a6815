namespace Meanfield.Heat;

/// <summary>Where two heat curves agree: the widest run of consecutive temperatures with |a/b - 1| within a tolerance.</summary>
public static class AgreementWindow
{
    /// <summary>
    /// (lowest, highest) temperature (K) of the longest run of points of <paramref name="curve"/> where
    /// |C / reference(T) - 1| &lt;= <paramref name="tolerance"/>; null when no point agrees.
    /// </summary>
    public static (double MinK, double MaxK)? Find(HeatCurve curve, Func<double, double> reference, double tolerance)
    {
        int bestStart = -1, bestLength = 0, start = -1;
        for (int i = 0; i <= curve.Count; i++)
        {
            bool ok = i < curve.Count && Agrees(curve.MolarHeat[i], reference(curve.TemperaturesK[i]), tolerance);
            if (ok && start < 0) start = i;
            if (!ok && start >= 0)
            {
                if (i - start > bestLength) { bestLength = i - start; bestStart = start; }
                start = -1;
            }
        }
        return bestStart < 0 ? null : (curve.TemperaturesK[bestStart], curve.TemperaturesK[bestStart + bestLength - 1]);
    }

    private static bool Agrees(double c, double reference, double tolerance) =>
        reference != 0 && double.IsFinite(c) && Math.Abs(c / reference - 1) <= tolerance;
}
