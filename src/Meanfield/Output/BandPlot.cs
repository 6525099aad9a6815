using Meanfield.Analysis.Bands;
using Meanfield.Units;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Band-structure plot: E_n(k) against path length, vertical lines and Γ/X/... tick labels at the path vertices,
/// an optional dashed line at the chemical potential, and optionally each band coloured by its correlated-orbital weight
/// with a colour bar.
/// </summary>
public static class BandPlot
{
    /// <summary>Builds the plot (for further styling) without saving it.</summary>
    /// <param name="unit">Unit of the energy axis; defaults to the bands' own unit (energies are converted).</param>
    /// <param name="chemicalPotential">Chemical potential (Fermi level) in the bands' own unit, or null for no line.</param>
    /// <param name="colourByCorrelatedWeight">Colour bands by correlated weight (blue = conduction, red = correlated).</param>
    /// <param name="labels">False draws no tick labels, title or axis labels (for tests of text rendering).</param>
    public static Plot Build(BandStructure bands, string title, EnergyUnit? unit = null, double? chemicalPotential = null,
                             bool colourByCorrelatedWeight = false, bool labels = true)
    {
        var u = unit ?? bands.Unit;
        double scale = bands.Unit.Joules() / u.Joules();
        var plot = labels
            ? PlotStyle.NewPlot(title, "Wave vector", PlotStyle.AxisLabel("Energy", u.Symbol()))
            : PlotStyle.NewPlot("", "", "");
        var path = bands.Path;
        var colormap = new CorrelatedWeightColormap();
        var black = new Color(20, 20, 20);
        for (int s = 0; s < path.SegmentStarts.Count; s++)
        {
            int from = path.SegmentStarts[s], to = path.SegmentEnd(s), count = to - from;
            for (int n = 0; n < bands.BandCount; n++)
            {
                if (!colourByCorrelatedWeight)
                {
                    var xs = new double[count]; var ys = new double[count];
                    for (int k = 0; k < count; k++) { xs[k] = path.Length[from + k]; ys[k] = scale * bands.Energy(from + k, n); }
                    var line = plot.Add.ScatterLine(xs, ys, black);
                    line.LineWidth = 1.8f;
                    continue;
                }
                for (int k = from; k + 1 < to; k++)
                {
                    double w = 0.5 * (bands.CorrelatedWeight(k, n) + bands.CorrelatedWeight(k + 1, n));
                    var seg = plot.Add.Line(path.Length[k], scale * bands.Energy(k, n), path.Length[k + 1], scale * bands.Energy(k + 1, n));
                    seg.LineColor = colormap.GetColor(w);
                    seg.LineWidth = 2.2f;
                    seg.MarkerSize = 0;
                }
            }
        }
        if (colourByCorrelatedWeight)
        {
            var bar = plot.Add.ColorBar(new CorrelatedWeightColormap.Axis(), Edge.Right);
            if (labels) bar.Label = "Correlated-orbital weight";
            bar.LabelStyle.FontName = PlotStyle.FontName;
            bar.LabelStyle.FontSize = PlotStyle.TickFontSize + 2;
        }

        double length = path.Length[path.Count - 1];
        var ticks = path.Ticks;
        foreach (var t in ticks)
            if (t.Position > 0 && t.Position < length) plot.Add.VerticalLine(t.Position, 1, Colors.Gray);
        if (labels)
        {
            plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
                ticks.Select(t => t.Position).ToArray(), ticks.Select(t => t.DisplayLabel).ToArray());
            plot.Axes.Bottom.TickLabelStyle.FontSize = PlotStyle.LabelFontSize;   // the point labels are the x axis
        }
        else
            plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual();

        var (lo, hi) = bands.EnergyRange();
        lo *= scale; hi *= scale;
        if (chemicalPotential is double mu)
        {
            var line = plot.Add.HorizontalLine(scale * mu, 1.5f, new Color(200, 0, 0), LinePattern.Dashed);
            if (labels)
            {
                line.LegendText = $"chemical potential μ = {scale * mu:G4} {u.Symbol()}";
                plot.ShowLegend(Alignment.UpperRight);
            }
            lo = Math.Min(lo, scale * mu); hi = Math.Max(hi, scale * mu);
        }
        double pad = 0.05 * Math.Max(hi - lo, 1e-12 + 1e-9 * Math.Abs(hi));
        plot.Axes.SetLimits(0, length, lo - pad, hi + pad);
        return plot;
    }

    /// <summary>Builds and saves the plot as .png or .svg (1000 x 700).</summary>
    public static void Save(BandStructure bands, string path, string title, EnergyUnit? unit = null,
                            double? chemicalPotential = null, bool colourByCorrelatedWeight = false) =>
        PlotStyle.Save(Build(bands, title, unit, chemicalPotential, colourByCorrelatedWeight), path);
}
