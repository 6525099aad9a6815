using System.Globalization;
using Meanfield.Analysis;
using ScottPlot;

namespace Meanfield.Scans;

/// <summary>
/// Draws a scan over two axes as a map: fixed colours per phase with readable names in a legend beside the data (or
/// any text column), a colour scale with a colour bar for a numeric column, optional contour lines of a numeric column
/// named in the legend, and hatched grey cells for points that did not converge. Axes are titled with their units
/// (<see cref="PhaseMapLabels.AxisTitle"/>), ticks sit at round values inside the grid's range, and the subtitle names
/// model, temperature and mesh. Log-spaced axes are drawn on a log scale labelled with the values. Written as .png, .svg or .pdf by extension.
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
            var labels = labelled.Select(r => color.Value(r.Row) as string ?? "(none)").Distinct()
                                 .OrderBy(PhaseOrder).ThenBy(l => l, StringComparer.Ordinal).ToList();
            Color Fill(string label) => PhaseColour(label) ?? palette.GetColor(labels.IndexOf(label));
            foreach (var (row, i, j) in labelled) Cell(plot, xs, ys, i, j, Fill(color.Value(row) as string ?? "(none)"));
            legend.AddRange(labels.Select(l => new LegendItem { LabelText = PhaseClassifier.Readable(l), FillColor = Fill(l) }));
        }
        else
        {
            // Cells as rectangles rather than a bitmap heatmap, so that .svg and .pdf stay vector.
            var values = new List<(int I, int J, double V)>();
            foreach (var (row, i, j) in rows)
                if (row.Result.Converged && ToDouble(color.Value(row)) is double v && double.IsFinite(v)) values.Add((i, j, v));
            double lo = values.Count > 0 ? values.Min(c => c.V) : 0, hi = values.Count > 0 ? values.Max(c => c.V) : 1;
            if (!(hi > lo)) hi = lo + 1;
            var scale = new ScottPlot.Colormaps.Viridis();
            foreach (var (i, j, v) in values) Cell(plot, xs, ys, i, j, scale.GetColor((v - lo) / (hi - lo)));
            var bar = plot.Add.ColorBar(new ColourScale(scale, lo, hi));
            bar.Axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic { LabelFormatter = Meanfield.Output.PlotStyle.Number, TargetTickCount = 8 };
            bar.Axis.TickLabelStyle.FontName = Meanfield.Output.PlotStyle.FontName;
            bar.Axis.TickLabelStyle.FontSize = Meanfield.Output.PlotStyle.TickFontSize;
            // The quantity and its unit are named in the heading: ScottPlot sets a bar title over the tick labels.
        }

        var failed = rows.Where(r => !r.Row.Result.Converged).ToList();
        foreach (var (_, i, j) in failed) Cell(plot, xs, ys, i, j, Colors.LightGray, hatched: true);
        if (failed.Count > 0)
            legend.Add(new LegendItem
            {
                LabelText = "not converged", FillColor = Colors.LightGray,
                FillHatch = new ScottPlot.Hatches.Striped(), FillHatchColor = Colors.DimGray,
            });

        if (options.ContourColumn is { } contourName && AddContours(plot, Column(table, contourName), rows, xs, ys, options.ContourLevels))
            legend.Add(new LegendItem
            {
                LabelText = $"contours of {Meanfield.Output.PlotStyle.AxisLabel(contourName, ColumnUnit(table, contourName))}",
                LineColor = Colors.Black, LineWidth = 1,
            });

        string energyUnit = table.Metadata.GetValueOrDefault(ScanMetadata.EnergyUnit) ?? "";
        string xTitle = PhaseMapLabels.AxisTitle(xa, grid, energyUnit), yTitle = PhaseMapLabels.AxisTitle(ya, grid, energyUnit);
        if (legend.Count > 0)
        {
            plot.Legend.ManualItems.AddRange(legend);
            plot.Legend.FontName = Meanfield.Output.PlotStyle.FontName;
            plot.Legend.FontSize = Meanfield.Output.PlotStyle.TickFontSize;
            plot.ShowLegend(Edge.Right);
        }
        plot.XLabel(xLog ? $"{xTitle}, log scale" : xTitle, Meanfield.Output.PlotStyle.LabelFontSize);
        plot.YLabel(yLog ? $"{yTitle}, log scale" : yTitle, Meanfield.Output.PlotStyle.LabelFontSize);
        string subtitle = PhaseMapLabels.Subtitle(table);
        string heading = options.Title ?? (colorBy == "phase" ? "Phase map"
            : $"{Meanfield.Output.PlotStyle.AxisLabel(colorBy, ColumnUnit(table, colorBy))} over {xTitle} and {yTitle}");
        plot.Title(subtitle.Length > 0 ? heading + "\n" + subtitle : heading, Meanfield.Output.PlotStyle.LabelFontSize);
        plot.Axes.Bottom.TickGenerator = xLog ? LogTicks(xs.Values) : Ticks(xs.Values);
        plot.Axes.Left.TickGenerator = yLog ? LogTicks(ys.Values) : Ticks(ys.Values);
        plot.Axes.Bottom.TickLabelStyle.FontSize = Meanfield.Output.PlotStyle.TickFontSize;
        plot.Axes.Left.TickLabelStyle.FontSize = Meanfield.Output.PlotStyle.TickFontSize;
        plot.HideGrid();
        plot.Axes.SetLimits(xs.Edges[0], xs.Edges[^1], ys.Edges[0], ys.Edges[^1]);
        return plot;
    }

    /// <summary>
    /// Fixed colours per phase, so that maps of different scans compare at a glance: insulators in blues and greens
    /// (darker for topological), Weyl in reds, Dirac in oranges, lighter tints for the variants with pockets
    /// (ColorBrewer "Paired", Brewer, Harrower &amp; Hillier, Cartogr. J. 40, 27 (2003)). Null for other text.
    /// </summary>
    private static Color? PhaseColour(string label) => PhaseOf(label) switch
    {
        Phase.Decoupled => new Color(202, 178, 214),
        Phase.KondoInsulator => new Color(166, 206, 227),
        Phase.TrivialKondoInsulator => new Color(31, 120, 180),
        Phase.WeakTopologicalKondoInsulator => new Color(178, 223, 138),
        Phase.StrongTopologicalKondoInsulator => new Color(51, 160, 44),
        Phase.TopologicalKondoInsulator => new Color(27, 120, 100),
        Phase.WeylSemimetal => new Color(227, 26, 28),
        Phase.WeylSemimetalWithPockets => new Color(251, 154, 153),
        Phase.DiracSemimetal => new Color(255, 127, 0),
        Phase.DiracSemimetalWithPockets => new Color(253, 191, 111),
        Phase.NodalLine => new Color(106, 61, 154),
        Phase.HeavyMetal => new Color(177, 89, 40),
        Phase.Unresolved => new Color(60, 60, 60),
        _ => null,
    };

    private static Phase? PhaseOf(string label)
    {
        foreach (var p in Enum.GetValues<Phase>()) if (PhaseClassifier.Name(p) == label) return p;
        return null;
    }

    // Legend order: the phases in the enum's order (insulators, semimetals, metal), then any other text.
    private static int PhaseOrder(string label) => PhaseOf(label) is Phase p ? (int)p : int.MaxValue;

    private static string? ColumnUnit(ScanTable table, string column)
    {
        if (table.Metadata.GetValueOrDefault(ScanMetadata.Units) is not { } json) return null;
        try
        {
            var unit = System.Text.Json.Nodes.JsonNode.Parse(json)?[column]?.GetValue<string>();
            return string.IsNullOrEmpty(unit) ? null : unit;
        }
        catch (System.Text.Json.JsonException) { return null; }
        catch (InvalidOperationException) { return null; }
    }

    /// <summary>
    /// Ticks at round numbers (1, 2, 2.5 or 5 times a power of ten, four to eight of them) between the first and
    /// last grid value, never in the half cell beyond, written without thousands separators.
    /// </summary>
    private static ScottPlot.TickGenerators.NumericManual Ticks(double[] values)
    {
        var ticks = new ScottPlot.TickGenerators.NumericManual();
        foreach (double t in TickPositions(values[0], values[^1])) ticks.AddMajor(t, TickLabel(t));
        return ticks;
    }

    /// <summary>
    /// Ticks of a log-spaced axis (plotted as log10 of the value) labelled with the values themselves: 1, 2 and 5 times
    /// each power of ten inside the grid, minor ticks at the other integer multiples (common practice for log axes).
    /// </summary>
    private static ScottPlot.TickGenerators.NumericManual LogTicks(double[] log10Values)
    {
        var ticks = new ScottPlot.TickGenerators.NumericManual();
        foreach (var (position, major) in LogTickPositions(log10Values[0], log10Values[^1]))
        {
            if (major) ticks.AddMajor(position, TickLabel(Math.Pow(10, position)));
            else ticks.AddMinor(position);
        }
        return ticks;
    }

    /// <summary>log10 positions of the ticks of <see cref="LogTicks"/> between two log10 values; major for 1, 2 and 5 times a power of ten.</summary>
    internal static IReadOnlyList<(double Log10, bool Major)> LogTickPositions(double lo, double hi)
    {
        var list = new List<(double, bool)>();
        for (int decade = (int)Math.Floor(lo) - 1; decade <= (int)Math.Ceiling(hi); decade++)
            for (int m = 1; m <= 9; m++)
            {
                double v = Math.Log10(m) + decade;
                if (v >= lo - 1e-9 && v <= hi + 1e-9) list.Add((v, m is 1 or 2 or 5));
            }
        return list;
    }

    /// <summary>Round tick positions from <paramref name="lo"/> to <paramref name="hi"/> (see <see cref="Ticks"/>).</summary>
    /// <param name="lo">First value.</param>
    /// <param name="hi">Last value.</param>
    /// <param name="count">About how many intervals to aim for.</param>
    internal static double[] TickPositions(double lo, double hi, int count = 7)
    {
        if (!(hi > lo)) return [lo];
        double raw = (hi - lo) / count, power = Math.Pow(10, Math.Floor(Math.Log10(raw))), step = 10 * power;
        foreach (double m in (double[])[1, 2, 2.5, 5]) if (m * power >= raw) { step = m * power; break; }
        var list = new List<double>();
        for (double t = Math.Ceiling(lo / step - 1e-9) * step; t <= hi + 1e-9 * step; t += step) list.Add(Math.Abs(t) < 1e-9 * step ? 0 : t);
        return [.. list];
    }

    /// <summary>A tick label: invariant culture, no thousands separators, no trailing zeros.</summary>
    internal static string TickLabel(double v) => v.ToString("0.######", CultureInfo.InvariantCulture);

    private sealed class ColourScale(IColormap colormap, double lo, double hi) : IHasColorAxis
    {
        public IColormap Colormap { get; set; } = colormap;
        public ScottPlot.Range GetRange() => new(lo, hi);
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
        // An outline in the fill colour closes the anti-aliasing seams between neighbouring cells.
        rect.LineWidth = 1;
        rect.LineColor = fill;
        if (hatched) { rect.FillStyle.Hatch = new ScottPlot.Hatches.Striped(); rect.FillStyle.HatchColor = Colors.DimGray; }
    }

    /// <returns>True when contours were drawn.</returns>
    private static bool AddContours(Plot plot, ScanColumn column,
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
        foreach (bool f in filled) if (!f) return false;
        if (xs.Values.Length < 2 || ys.Values.Length < 2) return false;
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var p in points) { lo = Math.Min(lo, p.Z); hi = Math.Max(hi, p.Z); }
        if (!(hi > lo)) return false;
        // Round levels inside the data (the tick rule, about the number asked for), so labels read as plain numbers.
        var values = TickPositions(lo, hi, Math.Max(1, levels)).Where(v => v > lo && v < hi).ToArray();
        if (values.Length == 0) return false;
        var contours = new ScottPlot.Plottables.ContourLines { ContourLineLevels = values };
        contours.Update(points);
        // The lines are drawn as plain paths with upright labels at the middle of each level's longest path (the
        // library's own labels follow the line's slope).
        foreach (var level in contours.Lines.GroupBy(l => l.Z))
        {
            foreach (var line in level)
            {
                var path = plot.Add.ScatterLine(line.Path.Points.ToArray(), Colors.Black);
                path.LineWidth = 1.2f;
                path.MarkerSize = 0;
            }
            var longest = level.MaxBy(l => l.Path.Points.Count())!.Path.Points.ToArray();
            if (longest.Length == 0) continue;
            var at = longest[longest.Length / 2];
            var text = plot.Add.Text(TickLabel(level.Key), at.X, at.Y);
            text.LabelFontName = Meanfield.Output.PlotStyle.FontName;
            text.LabelFontSize = Meanfield.Output.PlotStyle.TickFontSize - 1;
            text.LabelBackgroundColor = Colors.White.WithAlpha(0.8);
            text.LabelAlignment = Alignment.MiddleCenter;
        }
        return true;
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
