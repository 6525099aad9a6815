using Meanfield.Heat;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// The two pictures of a heat run: C/T against T^2 (where C/T = gamma + beta T^2 is a straight line) and log C against
/// log T (where C = A T^alpha is a straight line), each with the predicted curve, measured points and fitted lines.
/// </summary>
public static class HeatPlots
{
    /// <summary>C/T (mJ mol^-1 K^-2) against T^2 (K^2).</summary>
    public static void SaveSommerfeld(string path, string title, HeatCurve predicted, HeatCurve? measured,
                                      SommerfeldFit predictedFit, SommerfeldFit? measuredFit, HeatCurve? fullMeanField = null)
    {
        var plot = PlotStyle.NewPlot(title, "T² (K²)", "C/T (mJ mol⁻¹ K⁻²)");
        Line(plot, predicted.TemperaturesK.Select(t => t * t), predicted.TemperaturesK.Select((t, i) => 1e3 * predicted.MolarHeat[i] / t), "predicted", Colors.Blue, false);
        if (fullMeanField is not null)
            Line(plot, fullMeanField.TemperaturesK.Select(t => t * t), fullMeanField.TemperaturesK.Select((t, i) => 1e3 * fullMeanField.MolarHeat[i] / t), "full mean field", Colors.Purple, false);
        if (measured is not null)
            Points(plot, measured.TemperaturesK.Select(t => t * t), measured.TemperaturesK.Select((t, i) => 1e3 * measured.MolarHeat[i] / t), "measured", Colors.Black);
        double top = Math.Max(predicted.MaxTemperatureK, measured?.MaxTemperatureK ?? 0);
        FitLine(plot, predictedFit.COverT, Math.Min(top, 2 * predictedFit.WindowMaxK), x => x * x, $"fit: γ = {predictedFit.GammaMilli:G4}, β = {1e3 * predictedFit.Beta:G3}", Colors.Blue);
        if (measuredFit is not null)
            FitLine(plot, measuredFit.COverT, Math.Min(top, 2 * measuredFit.WindowMaxK), x => x * x, $"fit to data: γ = {measuredFit.GammaMilli:G4}, β = {1e3 * measuredFit.Beta:G3}", Colors.Red);
        plot.ShowLegend(Alignment.UpperLeft);
        PlotStyle.Save(plot, path);
    }

    /// <summary>C (J mol^-1 K^-1) against T (K) on logarithmic axes, with the power-law fits.</summary>
    public static void SaveLogLog(string path, string title, HeatCurve predicted, HeatCurve? measured,
                                  PowerLawFit predictedFit, PowerLawFit? measuredFit)
    {
        var plot = PlotStyle.NewPlot(title, "T (K)", "C (J mol⁻¹ K⁻¹)");
        static IEnumerable<double> Log(IEnumerable<double> v) => v.Select(Math.Log10);
        var pos = Enumerable.Range(0, predicted.Count).Where(i => predicted.MolarHeat[i] > 0).ToList();
        Line(plot, Log(pos.Select(i => predicted.TemperaturesK[i])), Log(pos.Select(i => predicted.MolarHeat[i])), "predicted", Colors.Blue, false);
        if (measured is not null)
        {
            var m = Enumerable.Range(0, measured.Count).Where(i => measured.MolarHeat[i] > 0).ToList();
            Points(plot, Log(m.Select(i => measured.TemperaturesK[i])), Log(m.Select(i => measured.MolarHeat[i])), "measured", Colors.Black);
        }
        PowerLine(plot, predictedFit, $"fit: C ∝ T^{predictedFit.Exponent:F2}", Colors.Blue);
        if (measuredFit is not null) PowerLine(plot, measuredFit, $"fit to data: C ∝ T^{measuredFit.Exponent:F2}", Colors.Red);
        foreach (var axis in new ScottPlot.IAxis[] { plot.Axes.Bottom, plot.Axes.Left })
        {
            var ticks = new ScottPlot.TickGenerators.NumericAutomatic
            {
                MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
                IntegerTicksOnly = true,
                LabelFormatter = v => Math.Pow(10, v).ToString("G3", System.Globalization.CultureInfo.InvariantCulture),
            };
            axis.TickGenerator = ticks;
        }
        plot.ShowLegend(Alignment.UpperLeft);
        PlotStyle.Save(plot, path);
    }

    private static void Line(Plot plot, IEnumerable<double> x, IEnumerable<double> y, string label, Color colour, bool dashed)
    {
        var s = plot.Add.ScatterLine(x.ToArray(), y.ToArray(), colour);
        s.LineWidth = 2; s.LegendText = label;
        if (dashed) s.LinePattern = LinePattern.Dashed;
    }

    private static void Points(Plot plot, IEnumerable<double> x, IEnumerable<double> y, string label, Color colour)
    {
        var s = plot.Add.ScatterPoints(x.ToArray(), y.ToArray(), colour);
        s.MarkerSize = 6; s.LegendText = label;
    }

    private static void FitLine(Plot plot, Func<double, double> cOverT, double topK, Func<double, double> x, string label, Color colour)
    {
        var t = Enumerable.Range(0, 50).Select(i => topK * i / 49.0).ToArray();
        var s = plot.Add.ScatterLine(t.Select(x).ToArray(), t.Select(v => 1e3 * cOverT(v)).ToArray(), colour);
        s.LineWidth = 1.5f; s.LinePattern = LinePattern.Dashed; s.LegendText = label;
    }

    private static void PowerLine(Plot plot, PowerLawFit fit, string label, Color colour)
    {
        double a = Math.Log10(fit.WindowMinK), b = Math.Log10(fit.WindowMaxK);
        double[] lx = [a, b];
        var s = plot.Add.ScatterLine(lx, lx.Select(v => Math.Log10(fit.MolarHeat(Math.Pow(10, v)))).ToArray(), colour);
        s.LineWidth = 2.5f; s.LinePattern = LinePattern.Dashed; s.LegendText = label;
    }
}
