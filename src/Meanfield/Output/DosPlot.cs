using Meanfield.Analysis.Dos;
using Meanfield.Units;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Picture of a DOS against E − mu: the conduction and correlated parts stacked as filled areas in the colours of the
/// band pictures' weight scale (blue conduction, red correlated; together they are the total, drawn as a black line),
/// each site's DOS as a dashed line when there is more than one site, and a dashed green line at mu. The energy window
/// defaults to <see cref="PlotWindow.AroundMu"/> over the correlated DOS; a window can be given instead.
/// </summary>
public static class DosPlot
{
    private static readonly Color[] SiteColours = [new(117, 80, 160), new(140, 86, 75), new(200, 90, 170), new(100, 100, 100), new(188, 189, 34)];

    /// <summary>Builds the plot (for further styling) without saving it.</summary>
    /// <param name="dos">The DOS, energies in <paramref name="unit"/>.</param>
    /// <param name="mu">Chemical potential in <paramref name="unit"/>.</param>
    /// <param name="unit">Energy unit of the DOS.</param>
    /// <param name="title">Plot title.</param>
    /// <param name="window">Window of E − mu; null for the default around the heavy bands.</param>
    public static Plot Build(DensityOfStates dos, double mu, EnergyUnit unit, string title, (double Low, double High)? window = null)
    {
        var u = unit.Symbol();
        var plot = PlotStyle.NewPlot(title, PlotStyle.AxisLabel("E − μ", u), PlotStyle.AxisLabel("DOS", $"states / cell / {u}"));
        int n = dos.Energies.Length;
        var x = new double[n]; var zero = new double[n]; var stack = new double[n];
        for (int i = 0; i < n; i++) { x[i] = dos.Energies[i] - mu; stack[i] = dos.Conduction[i] + dos.Correlated[i]; }

        var conduction = plot.Add.FillY(x, zero, dos.Conduction);
        conduction.FillColor = CorrelatedWeightColormap.ConductionColour.WithAlpha(0.55);
        conduction.LineWidth = 0;
        conduction.LegendText = "conduction orbitals";
        var correlated = plot.Add.FillY(x, dos.Conduction, stack);
        correlated.FillColor = CorrelatedWeightColormap.CorrelatedColour.WithAlpha(0.55);
        correlated.LineWidth = 0;
        correlated.LegendText = "correlated orbitals (stacked)";
        var total = plot.Add.ScatterLine(x, dos.Total, Colors.Black);
        total.LineWidth = 1.5f;
        total.LegendText = "total";
        if (dos.BySite.Count > 1)
            for (int s = 0; s < dos.BySite.Count; s++)
            {
                var site = plot.Add.ScatterLine(x, dos.BySite[s], SiteColours[s % SiteColours.Length]);
                site.LinePattern = LinePattern.Dashed;
                site.LineWidth = 1.2f;
                site.LegendText = $"site {dos.SiteNames[s]}";
            }
        var line = plot.Add.VerticalLine(0, 1.5f, PlotStyle.ChemicalPotentialColour, LinePattern.Dashed);
        line.LegendText = $"μ = {PlotStyle.Number(mu)} {u}";
        plot.ShowLegend(Edge.Right);

        var (lo, hi) = window ?? DefaultWindow(dos, mu);
        double top = 0;
        for (int i = 0; i < n; i++) if (x[i] >= lo && x[i] <= hi) top = Math.Max(top, Math.Max(dos.Total[i], stack[i]));
        plot.Axes.SetLimits(lo, hi, 0, top > 0 ? 1.05 * top : 1);
        return plot;
    }

    /// <summary>The default window of E − mu: <see cref="PlotWindow.AroundMu"/> weighted by the correlated DOS.</summary>
    public static (double Low, double High) DefaultWindow(DensityOfStates dos, double mu)
    {
        var x = new double[dos.Energies.Length];
        for (int i = 0; i < x.Length; i++) x[i] = dos.Energies[i] - mu;
        return PlotWindow.AroundMu(x, dos.Correlated, x[0], x[^1]);
    }

    /// <summary>Builds and saves the plot as .png, .svg or .pdf by extension.</summary>
    /// <exception cref="OutputPathException">Another extension; nothing is written.</exception>
    public static void Save(DensityOfStates dos, double mu, EnergyUnit unit, string path, string title, (double Low, double High)? window = null) =>
        PlotStyle.Save(Build(dos, mu, unit, title, window), path);
}
