using System.Globalization;
using ScottPlot;

namespace Meanfield.Scans;

/// <summary>
/// Draws a scan over two axes as a map: categorical colours with a legend for the phase label (or any text column),
/// a colour scale with a colour bar for a numeric column, optional contour lines of a numeric column, and hatched
/// grey cells for points that did not converge. Log-spaced axes are drawn as log10.
/// </summary>
public static class PhaseMap
{
    /// <summary>Reads a scan result and draws it to <paramref name="picturePath"/> (.png, .svg or .pdf by extension).</summary>
    /// <exception cref="Meanfield.Output.OutputPathException">The picture's extension is not .png, .svg or .pdf (checked before the scan is read).</exception>
    /// <exception cref="ScanError">The file is not a readable scan result, or an axis or column is not in it.</exception>
    public static void Save(string parquetFile, string xAxis, string yAxis, string colorBy, string picturePath, PhaseMapOptions? options = null)
    {
        Meanfield.Output.PlotStyle.CheckPictureName(picturePath);
        var o = options ?? new PhaseMapOptions();
        var table = ScanParquet.ReadAsync(parquetFile).GetAwaiter().GetResult();
        Meanfield.Output.PlotStyle.Save(Build(table, xAxis, yAxis, colorBy, o), picturePath, o.Width, o.Height);
    }

    public static Plot Build(ScanTable table, string xAxis, string yAxis, string colorBy, PhaseMapOptions options)
    {
        var grid = table.Grid;
        int ix = AxisIndex(table, xAxis), iy = AxisIndex(table, yAxis);
        var xa = grid.Axes[ix]; var ya = grid.Axes[iy];
        bool xLog = xa.Spacing == AxisSpacing.Log, yLog = ya.Spacing == AxisSpacing.Log;
        var xs = Coordinates(xa, xLog); var ys = Coordinates(ya, yLog);
        var color = Column(table, colorBy);

        var plot = new Plot();
        PlotFonts.Apply(plot);
        var rows = table.Rows.Select(r => (Row: r, I: Array.IndexOf(xs.Values, Coord(r.AxisValues[ix], xLog)),
                                           J: Array.IndexOf(ys.Values, Coord(r.AxisValues[iy], yLog)))).ToList();
        var legend = new List<LegendItem>();
        bool numeric = table.Rows.Any(r => color.Value(r) is IConvertible and not string);
        if (!numeric)
        {
            var palette = new ScottPlot.Palettes.Category10();
            // Points that did not converge carry no label: they are drawn hatched below, not as a category.
            var labelled = rows.Where(r => r.Row.Result.Converged).ToList();
            var labels = labelled.Select(r => color.Value(r.Row) as string ?? "(none)").Distinct().Order(StringComparer.Ordinal).ToList();
            foreach (var (row, i, j) in labelled)
            {
                var c = palette.GetColor(labels.IndexOf(color.Value(row) as string ?? "(none)"));
                Cell(plot, xs, ys, i, j, c);
            }
            legend.AddRange(labels.Select((l, k) => new LegendItem { LabelText = l, FillColor = palette.GetColor(k) }));
        }
        else
        {
            var z = new double[ys.Values.Length, xs.Values.Length];
            for (int a = 0; a < z.GetLength(0); a++) for (int b = 0; b < z.GetLength(1); b++) z[a, b] = double.NaN;
            foreach (var (row, i, j) in rows)
                if (row.Result.Converged && ToDouble(color.Value(row)) is double v) z[ys.Values.Length - 1 - j, i] = v;
            var heat = plot.Add.Heatmap(z);
            heat.Colormap = new ScottPlot.Colormaps.Viridis();
            heat.NaNCellColor = Colors.Transparent;
            heat.Rectangle = new CoordinateRect(xs.Edges[0], xs.Edges[^1], ys.Edges[0], ys.Edges[^1]);
            var bar = plot.Add.ColorBar(heat);
            bar.Label = colorBy;
        }

        var failed = rows.Where(r => !r.Row.Result.Converged).ToList();
        foreach (var (_, i, j) in failed) Cell(plot, xs, ys, i, j, Colors.LightGray, hatched: true);
        if (failed.Count > 0)
            legend.Add(new LegendItem
            {
                LabelText = "not converged", FillColor = Colors.LightGray,
                FillHatch = new ScottPlot.Hatches.Striped(), FillHatchColor = Colors.DimGray,
            });

        if (options.ContourColumn is { } contourName) AddContours(plot, table, Column(table, contourName), rows, xs, ys, options.ContourLevels);

        if (legend.Count > 0) plot.ShowLegend(legend, Alignment.UpperRight);
        plot.XLabel(xLog ? $"log10({xa.Name})" : xa.Name);
        plot.YLabel(yLog ? $"log10({ya.Name})" : ya.Name);
        plot.Title(options.Title ?? $"{colorBy} over {xa.Name} and {ya.Name}");
        plot.Axes.SetLimits(xs.Edges[0], xs.Edges[^1], ys.Edges[0], ys.Edges[^1]);
        return plot;
    }

    private sealed record AxisCoords(double[] Values, double[] Edges);

    private static double Coord(double v, bool log) => log ? Math.Log10(v) : v;

    /// <summary>Sorted plot coordinates of an axis and the cell edges halfway between them.</summary>
    private static AxisCoords Coordinates(ScanAxis axis, bool log)
    {
        var v = axis.Values.Select(x => Coord(x, log)).ToArray();
        var sorted = v.Order().ToArray();
        var edges = new double[sorted.Length + 1];
        double half = sorted.Length > 1 ? (sorted[1] - sorted[0]) / 2 : 0.5;
        edges[0] = sorted[0] - half;
        for (int i = 1; i < sorted.Length; i++) edges[i] = (sorted[i - 1] + sorted[i]) / 2;
        edges[^1] = sorted[^1] + (sorted.Length > 1 ? (sorted[^1] - sorted[^2]) / 2 : 0.5);
        return new AxisCoords(sorted, edges);
    }

    private static void Cell(Plot plot, AxisCoords xs, AxisCoords ys, int i, int j, Color fill, bool hatched = false)
    {
        if (i < 0 || j < 0) return;
        var rect = plot.Add.Rectangle(xs.Edges[i], xs.Edges[i + 1], ys.Edges[j], ys.Edges[j + 1]);
        rect.FillColor = fill;
        rect.LineWidth = 0;
        if (hatched) { rect.FillStyle.Hatch = new ScottPlot.Hatches.Striped(); rect.FillStyle.HatchColor = Colors.DimGray; }
    }

    private static void AddContours(Plot plot, ScanTable table, ScanColumn column,
                                    List<(ScanRow Row, int I, int J)> rows, AxisCoords xs, AxisCoords ys, int levels)
    {
        var points = new Coordinates3d[ys.Values.Length, xs.Values.Length];
        var filled = new bool[ys.Values.Length, xs.Values.Length];
        foreach (var (row, i, j) in rows)
        {
            if (i < 0 || j < 0 || ToDouble(column.Value(row)) is not double z || !double.IsFinite(z)) continue;
            points[j, i] = new Coordinates3d(xs.Values[i], ys.Values[j], z);
            filled[j, i] = true;
        }
        // Contouring needs a full rectangle of values; a scan with gaps (more than two axes, failures) gets none.
        foreach (bool f in filled) if (!f) return;
        if (xs.Values.Length < 2 || ys.Values.Length < 2) return;
        var contours = plot.Add.ContourLines(points, levels);
        contours.LineColor = Colors.Black;
    }

    private static int AxisIndex(ScanTable table, string name)
    {
        string bare = name.StartsWith("axis_", StringComparison.Ordinal) ? name[5..] : name;
        int i = table.Schema.AxisNames.ToList().IndexOf(bare);
        return i >= 0 ? i : throw new ScanError($"{table.Path}: no axis '{bare}'" + ClosestName.Hint(bare, table.Schema.AxisNames));
    }

    private static ScanColumn Column(ScanTable table, string name) =>
        table.Schema.Columns.FirstOrDefault(c => c.Field.Name == name)
        ?? throw new ScanError($"{table.Path}: no column '{name}'" + ClosestName.Hint(name, table.Schema.Columns.Select(c => c.Field.Name)));

    private static double? ToDouble(object? v) => v switch
    {
        null => null,
        bool b => b ? 1 : 0,
        IConvertible c and not string => c.ToDouble(CultureInfo.InvariantCulture),
        _ => null,
    };
}
