using Meanfield.Analysis.Bands;
using Meanfield.Units;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Band-structure plot: E_n(k) against path length, vertical lines and Γ/X/... tick labels at the path vertices,
/// an optional dashed line at the chemical potential, and optionally each band coloured by its correlated-orbital weight
/// with a colour bar. With a chemical potential the energy axis is E - mu and, unless a window is given, shows the
/// heavy bands: see <see cref="HeavyWindow"/>.
/// </summary>
public static class BandPlot
{
    /// <summary>Builds the plot (for further styling) without saving it.</summary>
    /// <param name="unit">Unit of the energy axis; defaults to the bands' own unit (energies are converted).</param>
    /// <param name="chemicalPotential">Chemical potential (Fermi level) in the bands' own unit, or null for no line.</param>
    /// <param name="colourByCorrelatedWeight">Colour bands by correlated weight (blue = conduction, red = correlated).</param>
    /// <param name="labels">False draws no tick labels, title or axis labels (for tests of text rendering).</param>
    /// <param name="window">Energy window (E1, E2) relative to mu, in <paramref name="unit"/>; null: <see cref="HeavyWindow"/>
    /// with a chemical potential, the whole band range without. Ignored without a chemical potential.</param>
    public static Plot Build(BandStructure bands, string title, EnergyUnit? unit = null, double? chemicalPotential = null,
                             bool colourByCorrelatedWeight = false, bool labels = true, (double Lo, double Hi)? window = null,
                             int? highestFilled = null)
    {
        var u = unit ?? bands.Unit;
        double scale = bands.Unit.Joules() / u.Joules();
        // Energies are drawn relative to mu when there is one (E - mu), absolute otherwise.
        double shift = chemicalPotential ?? 0;
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
            // Green: a colour the blue-to-red weight map never uses.
            var line = plot.Add.HorizontalLine(0, 1.5f, MuColour, LinePattern.Dashed);
            if (labels)
            {
                line.LegendText = FormattableString.Invariant($"μ = {scale * mu:0.###} {u.Symbol()}");
                plot.ShowLegend(Alignment.UpperRight);
            }
            if (window is { } w) (lo, hi) = w;
            else if (HeavyWindow(bands, mu, highestFilled) is { } heavy) (lo, hi) = (scale * heavy.Lo, scale * heavy.Hi);
            else (lo, hi) = (lo - scale * mu, hi - scale * mu);
        }
        double pad = 0.05 * Math.Max(hi - lo, 1e-12 + 1e-9 * Math.Abs(hi));
        plot.Axes.SetLimits(0, length, lo - pad, hi + pad);
        return plot;
    }

    /// <summary>Colour of the chemical-potential line.</summary>
    public static readonly Color MuColour = new(0, 150, 60);

    /// <summary>How far the default window reaches beyond the heavy span, as a share of its width, on each side.</summary>
    public const double HeavyWindowMargin = 1.0;

    /// <summary>Share of the path's states on the bands next to mu left out at each end of the heavy span (a quantile).</summary>
    public const double HeavyQuantile = 0.2;

    /// <summary>
    /// The default window relative to mu (bands' unit). Take the highest band that starts below mu and the lowest band
    /// that ends above it; the heavy span runs between the <see cref="HeavyQuantile"/> and 1 - <see cref="HeavyQuantile"/>
    /// quantiles of their energies along the path (the flat part of the heavy bands of a Kondo lattice fills most of
    /// the path; their steep tails, tens to hundreds of times wider, cover less of it and are left out). The window is that span (always including
    /// mu) widened by <see cref="HeavyWindowMargin"/> of its width on each side;
    /// null when no band lies on either side of mu.
    /// </summary>
    /// <param name="bands">The bands along the path.</param>
    /// <param name="mu">The chemical potential (bands' unit).</param>
    /// <param name="highestFilled">Index of the highest filled band at a whole filling (then bands highestFilled and
    /// highestFilled + 1 are the pair); null to find the bands next to mu from their ranges.</param>
    public static (double Lo, double Hi)? HeavyWindow(BandStructure bands, double mu, int? highestFilled = null)
    {
        int below = -1, above = -1;
        var min = new double[bands.BandCount]; var max = new double[bands.BandCount];
        for (int n = 0; n < bands.BandCount; n++)
        {
            min[n] = double.PositiveInfinity; max[n] = double.NegativeInfinity;
            for (int k = 0; k < bands.Path.Count; k++) { double e = bands.Energy(k, n); min[n] = Math.Min(min[n], e); max[n] = Math.Max(max[n], e); }
        }
        for (int n = 0; n < bands.BandCount; n++)
        {
            if (min[n] < mu) below = n;
            if (above < 0 && max[n] > mu) above = n;
        }
        if (highestFilled is int h && h >= 0 && h + 1 < bands.BandCount) (below, above) = (h, h + 1);
        if (below < 0 || above < 0) return null;
        var energies = new List<double>(2 * bands.Path.Count);
        foreach (int n in below == above ? [below] : new[] { below, above })
            for (int k = 0; k < bands.Path.Count; k++) energies.Add(bands.Energy(k, n));
        energies.Sort();
        double lo = energies[(int)(HeavyQuantile * (energies.Count - 1))], hi = energies[(int)Math.Ceiling((1 - HeavyQuantile) * (energies.Count - 1))];
        lo = Math.Min(lo, mu); hi = Math.Max(hi, mu);
        double margin = HeavyWindowMargin * (hi - lo);
        return (lo - margin - mu, hi + margin - mu);
    }

    /// <summary>Builds and saves the plot as .png or .svg (1000 x 700).</summary>
    public static void Save(BandStructure bands, string path, string title, EnergyUnit? unit = null,
                            double? chemicalPotential = null, bool colourByCorrelatedWeight = false, (double Lo, double Hi)? window = null,
                            int? highestFilled = null) =>
        PlotStyle.Save(Build(bands, title, unit, chemicalPotential, colourByCorrelatedWeight, window: window, highestFilled: highestFilled), path);
}
