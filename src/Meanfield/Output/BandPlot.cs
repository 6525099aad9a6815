using Meanfield.Analysis.Bands;
using Meanfield.Units;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Band-structure plot: E_n(k) − mu against path length (absolute energies when no chemical potential is given),
/// vertical lines and Γ/X/... tick labels at the path vertices, a dashed green line at mu (a colour the weight scale
/// never uses), and optionally each band coloured by its correlated-orbital weight with a colour bar. The energy
/// window defaults to <see cref="PlotWindow.AroundMu"/> over the states' correlated weights (the heavy bands a few of
/// their widths around mu); a window can be given instead.
/// </summary>
public static class BandPlot
{
    /// <summary>Builds the plot (for further styling) without saving it.</summary>
    /// <param name="unit">Unit of the energy axis; defaults to the bands' own unit (energies are converted).</param>
    /// <param name="chemicalPotential">Chemical potential (Fermi level) in the bands' own unit, or null for no line.</param>
    /// <param name="colourByCorrelatedWeight">Colour bands by correlated weight (blue = conduction, red = correlated).</param>
    /// <param name="labels">False draws no tick labels, title or axis labels (for tests of text rendering).</param>
    /// <param name="window">Energy window (E − mu, in <paramref name="unit"/>) of the picture; null for the default
    /// around the heavy bands (<see cref="DefaultWindow"/>). Ignored without a chemical potential.</param>
    public static Plot Build(BandStructure bands, string title, EnergyUnit? unit = null, double? chemicalPotential = null,
                             bool colourByCorrelatedWeight = false, bool labels = true, (double Low, double High)? window = null)
    {
        var u = unit ?? bands.Unit;
        double scale = bands.Unit.Joules() / u.Joules();
        double shift = chemicalPotential ?? 0;   // energies are drawn as scale * (E - shift)
        var plot = labels
            ? PlotStyle.NewPlot(title, "Wave vector", PlotStyle.AxisLabel(chemicalPotential is null ? "Energy" : "E − μ", u.Symbol()))
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
                    for (int k = 0; k < count; k++) { xs[k] = path.Length[from + k]; ys[k] = scale * (bands.Energy(from + k, n) - shift); }
                    var line = plot.Add.ScatterLine(xs, ys, black);
                    line.LineWidth = 1.8f;
                    continue;
                }
                for (int k = from; k + 1 < to; k++)
                {
                    double w = 0.5 * (bands.CorrelatedWeight(k, n) + bands.CorrelatedWeight(k + 1, n));
                    var seg = plot.Add.Line(path.Length[k], scale * (bands.Energy(k, n) - shift), path.Length[k + 1], scale * (bands.Energy(k + 1, n) - shift));
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
            bar.Axis.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
                [0, 0.25, 0.5, 0.75, 1], ["0", "0.25", "0.5", "0.75", "1"]);
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
        lo = scale * (lo - shift); hi = scale * (hi - shift);
        if (chemicalPotential is double mu)
        {
            var line = plot.Add.HorizontalLine(0, 1.5f, PlotStyle.ChemicalPotentialColour, LinePattern.Dashed);
            if (labels)
            {
                line.LegendText = $"μ = {PlotStyle.Number(scale * mu)} {u.Symbol()}";
                plot.ShowLegend(Alignment.UpperRight);
            }
            (lo, hi) = window ?? DefaultWindow(bands, mu, u);
        }
        double pad = 0.05 * Math.Max(hi - lo, 1e-12 + 1e-9 * Math.Abs(hi));
        plot.Axes.SetLimits(0, length, lo - pad, hi + pad);
        return plot;
    }

    /// <summary>
    /// The default window (E − mu, in <paramref name="unit"/>): <see cref="PlotWindow.AroundMu"/> over every state on
    /// the path weighted by its correlated-orbital weight; the whole range when the bands carry no correlated weight.
    /// </summary>
    public static (double Low, double High) DefaultWindow(BandStructure bands, double chemicalPotential, EnergyUnit? unit = null)
    {
        double scale = bands.Unit.Joules() / (unit ?? bands.Unit).Joules();
        int n = bands.KCount * bands.BandCount, i = 0;
        var e = new double[n]; var w = new double[n];
        for (int k = 0; k < bands.KCount; k++)
            for (int b = 0; b < bands.BandCount; b++, i++) { e[i] = scale * (bands.Energy(k, b) - chemicalPotential); w[i] = bands.CorrelatedWeight(k, b); }
        var (lo, hi) = bands.EnergyRange();
        return PlotWindow.AroundMu(e, w, scale * (lo - chemicalPotential), scale * (hi - chemicalPotential));
    }

    /// <summary>Builds and saves the plot as .png, .svg or .pdf by extension (1000 x 700).</summary>
    /// <exception cref="OutputPathException">Another extension; nothing is written.</exception>
    public static void Save(BandStructure bands, string path, string title, EnergyUnit? unit = null,
                            double? chemicalPotential = null, bool colourByCorrelatedWeight = false, (double Low, double High)? window = null) =>
        PlotStyle.Save(Build(bands, title, unit, chemicalPotential, colourByCorrelatedWeight, window: window), path);
}
