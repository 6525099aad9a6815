namespace Meanfield.Heat;

/// <summary>
/// Side-by-side fits of the same forms (Sommerfeld C/T = gamma + beta T^2 and free power law C = A T^alpha) to a predicted
/// and a measured curve over one window, with the point-by-point residuals. Both curves must already mean the same thing
/// (say, electronic C after phonon subtraction), per mole of formula units.
/// </summary>
public sealed record HeatComparison(SommerfeldFit PredictedSommerfeld, SommerfeldFit MeasuredSommerfeld,
                                    PowerLawFit PredictedPowerLaw, PowerLawFit MeasuredPowerLaw,
                                    IReadOnlyList<HeatResidual> Residuals)
{
    /// <summary>gamma_measured / gamma_predicted: the mass enhancement the model leaves unexplained (1 = full agreement).</summary>
    public double GammaRatio => MeasuredSommerfeld.Gamma / PredictedSommerfeld.Gamma;

    /// <summary>Root-mean-square relative residual over the table.</summary>
    public double RmsRelativeResidual =>
        Residuals.Count == 0 ? double.NaN : Math.Sqrt(Residuals.Average(r => r.Relative * r.Relative));

    /// <summary>
    /// Compare over [<paramref name="windowMinK"/>, <paramref name="windowMaxK"/>] (K). Residual rows are the measured
    /// points in the window that lie inside the predicted curve's range.
    /// </summary>
    public static HeatComparison Compare(HeatCurve predicted, HeatCurve measured, double windowMinK, double windowMaxK)
    {
        if (!(windowMaxK > windowMinK)) throw new ArgumentException("the comparison window needs max > min");
        var residuals = new List<HeatResidual>();
        for (int i = 0; i < measured.Count; i++)
        {
            double t = measured.TemperaturesK[i];
            if (t < windowMinK || t > windowMaxK || t < predicted.MinTemperatureK || t > predicted.MaxTemperatureK) continue;
            residuals.Add(new HeatResidual(t, measured.MolarHeat[i], predicted.At(t)));
        }
        return new HeatComparison(
            SommerfeldFit.Fit(predicted, windowMinK, windowMaxK), SommerfeldFit.Fit(measured, windowMinK, windowMaxK),
            PowerLawFit.Fit(predicted, windowMinK, windowMaxK), PowerLawFit.Fit(measured, windowMinK, windowMaxK),
            residuals);
    }
}
