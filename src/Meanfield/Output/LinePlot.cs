using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// A generic x-y line plot in the house style (<see cref="PlotStyle"/>): curves with a legend, labelled axes with units,
/// optional dashed reference lines. DOS, specific-heat and scan plots reuse it.
/// </summary>
public static class LinePlot
{
    /// <summary>Builds the plot (for further styling) without saving it.</summary>
    public static Plot Build(string title, string xQuantity, string? xUnit, string yQuantity, string? yUnit,
                             IReadOnlyList<LineSeries> series, IReadOnlyList<double>? verticalLines = null,
                             IReadOnlyList<double>? horizontalLines = null)
    {
        var plot = PlotStyle.NewPlot(title, PlotStyle.AxisLabel(xQuantity, xUnit), PlotStyle.AxisLabel(yQuantity, yUnit));
        foreach (var s in series)
        {
            if (s.X.Count != s.Y.Count) throw new ArgumentException($"Series '{s.Label}': {s.X.Count} x values but {s.Y.Count} y values.");
            var line = plot.Add.ScatterLine(s.X.ToArray(), s.Y.ToArray());
            line.LineWidth = s.Width;
            if (s.Dashed) line.LinePattern = LinePattern.Dashed;
            if (!string.IsNullOrEmpty(s.Label)) line.LegendText = s.Label;
        }
        foreach (var x in verticalLines ?? []) plot.Add.VerticalLine(x, 1, Colors.Gray, LinePattern.Dashed);
        foreach (var y in horizontalLines ?? []) plot.Add.HorizontalLine(y, 1, Colors.Gray, LinePattern.Dashed);
        if (series.Any(s => !string.IsNullOrEmpty(s.Label))) plot.ShowLegend(Alignment.UpperRight);
        return plot;
    }

    /// <summary>Builds and saves the plot (.png or .svg, <see cref="PlotStyle.Width"/> x <see cref="PlotStyle.Height"/>).</summary>
    public static void Save(string path, string title, string xQuantity, string? xUnit, string yQuantity, string? yUnit,
                            IReadOnlyList<LineSeries> series, IReadOnlyList<double>? verticalLines = null,
                            IReadOnlyList<double>? horizontalLines = null) =>
        PlotStyle.Save(Build(title, xQuantity, xUnit, yQuantity, yUnit, series, verticalLines, horizontalLines), path);
}
