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

    /// <summary>
    /// The two pictures of a heat study beside <paramref name="tablePath"/>: C/T against T^2 over the low-temperature
    /// part (.png; fit window shaded, fit and node term with their units, measured data named with what was
    /// subtracted) and log C against log T over the whole range (.loglog.png; power law, node term, departure). Returns
    /// the paths written.
    /// </summary>
    public static IReadOnlyList<string> SaveStudy(string tablePath, HeatStudyResult r)
    {
        var png = Path.ChangeExtension(tablePath, ".png");
        var loglog = Path.ChangeExtension(tablePath, ".loglog.png");
        SommerfeldStudy(png, r);
        LogLogStudy(loglog, r);
        return [png, loglog];
    }

    private const string CoverTUnit = "mJ mol⁻¹ K⁻²", BetaUnit = "mJ mol⁻¹ K⁻⁴";

    private static string MeasuredLabel(MeasuredHeat m) =>
        // The table keeps the ASCII spelling; the picture writes the symbol.
        m.Subtracted.Length > 0 ? $"measured minus {m.Subtracted.Replace("Theta_D", "Θ_D", StringComparison.Ordinal)}" : "measured (nothing subtracted)";

    private static void SommerfeldStudy(string path, HeatStudyResult r)
    {
        var e = r.Expansion;
        double tMax = r.Curve.MaxTemperatureK;
        double top = Math.Min(tMax, Math.Max(2 * e.WindowMaxK, 1.5 * (r.DepartureK ?? 0)));
        var plot = PlotStyle.NewPlot($"{r.Model.Name}: C/T against T² (T ≤ {top:G3} K)", "T² (K²)", $"C/T ({CoverTUnit})");
        var span = plot.Add.HorizontalSpan(e.WindowMinK * e.WindowMinK, e.WindowMaxK * e.WindowMaxK);
        span.FillStyle.Color = Colors.Blue.WithAlpha(0.10);
        span.LineStyle.Width = 0;
        span.LegendText = $"fit window {e.WindowMinK:G3}–{e.WindowMaxK:G3} K";
        var idx = Enumerable.Range(0, r.Curve.Count).Where(i => r.Curve.TemperaturesK[i] <= top * (1 + 1e-12)).ToList();
        Line(plot, idx.Select(i => r.Curve.TemperaturesK[i] * r.Curve.TemperaturesK[i]),
             idx.Select(i => 1e3 * r.Curve.MolarHeat[i] / r.Curve.TemperaturesK[i]), "predicted (quasiparticles)", Colors.Blue, false);
        string fitLabel = $"fit: γ = {e.GammaMilli:G3} ± {1e3 * e.GammaError:G2} {CoverTUnit}, β = {1e3 * e.Beta:G4} {BetaUnit}"
                          + (e.Terms == 3 ? " (+ δT⁴)" : "");
        FitLine(plot, e.COverT, e.WindowMaxK, x => x * x, fitLabel, Colors.Orange);
        if (r.Nodes is { Cones: > 0 } n)
            FitLine(plot, t => n.MolarBeta * t * t, top, x => x * x,
                    $"node term, {n.Cones} cones, tilt factor 1/(1−w²)² = {n.TiltFactor:G3}: β = {1e3 * n.MolarBeta:G4} {BetaUnit}", Colors.Green);
        if (r.Measured is { } m)
        {
            var mi = Enumerable.Range(0, m.Curve.Count).Where(i => m.Curve.TemperaturesK[i] <= top).ToList();
            Points(plot, mi.Select(i => m.Curve.TemperaturesK[i] * m.Curve.TemperaturesK[i]),
                   mi.Select(i => 1e3 * m.Curve.MolarHeat[i] / m.Curve.TemperaturesK[i]), MeasuredLabel(m), Colors.Black);
            if (r.Comparison is { } c)
                FitLine(plot, c.MeasuredSommerfeld.COverT, Math.Min(top, 2 * c.MeasuredSommerfeld.WindowMaxK), x => x * x,
                        $"fit to data: γ = {c.MeasuredSommerfeld.GammaMilli:G4} {CoverTUnit}, β = {1e3 * c.MeasuredSommerfeld.Beta:G3} {BetaUnit}", Colors.Red);
        }
        if (r.FullCurve is { } full)
        {
            var fi = Enumerable.Range(0, full.Count).Where(i => full.TemperaturesK[i] <= top).ToList();
            if (fi.Count > 1)
                Line(plot, fi.Select(i => full.TemperaturesK[i] * full.TemperaturesK[i]),
                     fi.Select(i => 1e3 * full.MolarHeat[i] / full.TemperaturesK[i]), "full mean field −T d²F/dT²", Colors.Purple, false);
        }
        if (r.DepartureK is { } dep && dep <= top)
        {
            var v = plot.Add.VerticalLine(dep * dep, 1, Colors.Gray, LinePattern.Dotted);
            v.LegendText = $"C leaves γT + βT³ by {HeatStudy.DeparturePercent} % at {dep:G3} K";
        }
        plot.Axes.SetLimitsX(0, top * top);
        if (idx.All(i => r.Curve.MolarHeat[i] >= 0)) plot.Axes.SetLimitsY(0, 1.05e3 * idx.Max(i => r.Curve.MolarHeat[i] / r.Curve.TemperaturesK[i]));
        plot.ShowLegend(Alignment.LowerRight); // the curves rise from the lower left: keep them clear
        PlotStyle.Save(plot, path);
    }

    private static void LogLogStudy(string path, HeatStudyResult r)
    {
        var plot = PlotStyle.NewPlot($"{r.Model.Name}: log C against log T", "T (K)", "C (J mol⁻¹ K⁻¹)");
        var e = r.Expansion;
        var span = plot.Add.HorizontalSpan(Math.Log10(e.WindowMinK), Math.Log10(e.WindowMaxK));
        span.FillStyle.Color = Colors.Blue.WithAlpha(0.10);
        span.LineStyle.Width = 0;
        span.LegendText = $"fit window of γ + βT² + δT⁴, {e.WindowMinK:G3}–{e.WindowMaxK:G3} K";
        static IEnumerable<double> Log(IEnumerable<double> v) => v.Select(Math.Log10);
        var c = r.Curve;
        var pos = Enumerable.Range(0, c.Count).Where(i => c.MolarHeat[i] > 0).ToList();
        Line(plot, Log(pos.Select(i => c.TemperaturesK[i])), Log(pos.Select(i => c.MolarHeat[i])), "predicted (quasiparticles)", Colors.Blue, false);
        if (r.Nodes is { Cones: > 0 } n)
        {
            double[] lx = [Math.Log10(c.MinTemperatureK), Math.Log10(c.MaxTemperatureK)];
            var s = plot.Add.ScatterLine(lx, lx.Select(x => Math.Log10(n.MolarHeat(Math.Pow(10, x)))).ToArray(), Colors.Green);
            s.LineWidth = 1.5f; s.LinePattern = LinePattern.Dashed;
            s.LegendText = $"node term β T³, β = {1e3 * n.MolarBeta:G4} {BetaUnit}";
        }
        if (r.PowerLaw is { } p) PowerLine(plot, p, $"power law over the fit window: C ∝ T^{p.Exponent:F2}", Colors.Orange);
        if (r.Measured is { } m)
        {
            var mi = Enumerable.Range(0, m.Curve.Count).Where(i => m.Curve.MolarHeat[i] > 0).ToList();
            Points(plot, Log(mi.Select(i => m.Curve.TemperaturesK[i])), Log(mi.Select(i => m.Curve.MolarHeat[i])), MeasuredLabel(m), Colors.Black);
            if (r.Comparison is { } cmp) PowerLine(plot, cmp.MeasuredPowerLaw, $"fit to data: C ∝ T^{cmp.MeasuredPowerLaw.Exponent:F2}", Colors.Red);
        }
        if (r.DepartureK is { } d)
        {
            var v = plot.Add.VerticalLine(Math.Log10(d), 1, Colors.Gray, LinePattern.Dotted);
            v.LegendText = $"C leaves γT + βT³ by {HeatStudy.DeparturePercent} % at {d:G3} K";
        }
        foreach (var axis in new ScottPlot.IAxis[] { plot.Axes.Bottom, plot.Axes.Left })
            axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
                IntegerTicksOnly = true,
                LabelFormatter = v => Math.Pow(10, v).ToString("G3", System.Globalization.CultureInfo.InvariantCulture),
            };
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
