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
    public static void Save(string parquetFile, string xAxis, string yAxis, string colorBy, string pngPath, PhaseMapOptions? options = null)
    {
        var table = ScanParquet.ReadAsync(parquetFile).GetAwaiter().GetResult();
        var o = options ?? new PhaseMapOptions();
        var plot = Build(table, xAxis, yAxis, colorBy, o);
        // Written as the extension says (.png raster, .svg vector), atomically.
        Output.PlotStyle.Save(plot, pngPath, o.Width, o.Height);
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
            bool phases = colorBy == "phase";
            legend.AddRange(labels.Select((l, k) => new LegendItem { LabelText = phases ? Analysis.PhaseClassifier.Readable(l) : l, FillColor = palette.GetColor(k) }));
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

        // The legend sits outside the data, to the right.
        if (legend.Count > 0) { plot.Legend.ManualItems.AddRange(legend); plot.ShowLegend(Edge.Right); }
        string unit = table.Metadata.GetValueOrDefault(ScanMetadata.EnergyUnit) ?? "";
        plot.XLabel(AxisLabel(xa, grid, unit, xLog));
        plot.YLabel(AxisLabel(ya, grid, unit, yLog));
        plot.Title((options.Title ?? (colorBy == "phase" ? "Phase map" : colorBy)) + Subtitle(table, grid, unit));
        plot.Axes.SetLimits(xs.Edges[0], xs.Edges[^1], ys.Edges[0], ys.Edges[^1]);
        // Ticks on the grid values themselves (inside the data range), when there are few enough to read.
        plot.Axes.Bottom.TickGenerator = xs.Values.Length <= MaxLabelledTicks ? Ticks(xs.Values) : Output.PlotStyle.PlainTicks();
        plot.Axes.Left.TickGenerator = ys.Values.Length <= MaxLabelledTicks ? Ticks(ys.Values) : Output.PlotStyle.PlainTicks();
        return plot;
    }

    // "V (meV)" for a model parameter, "T (K)" for temperature, "ratio (m = ratio * lso)" for a free variable.
    private static string AxisLabel(ScanAxis axis, ScanGrid grid, string energyUnit, bool log)
    {
        var tie = grid.Ties.FirstOrDefault(t => System.Text.RegularExpressions.Regex.IsMatch(t.Value, $@"\b{axis.Name}\b"));
        var ratio = tie.Key is null ? null : System.Text.RegularExpressions.Regex.Match(tie.Value, $@"^\s*{axis.Name}\s*\*\s*(\w+)\s*$");
        string name = axis.IsTemperature ? $"T ({axis.Unit})"
            : axis.IsFreeVariable ? ratio is { Success: true } ? $"{tie.Key} / {ratio.Groups[1].Value}"
                                  : tie.Key is not null ? $"{axis.Name} ({tie.Key} = {tie.Value})" : axis.Name
            : energyUnit.Length > 0 ? $"{axis.Name} ({energyUnit})" : axis.Name;
        return log ? $"log10 {name}" : name;
    }

    // "\nOrvathite, T = 2 K, mesh 10" from the model and scan texts the file carries.
    private static string Subtitle(ScanTable table, ScanGrid grid, string energyUnit)
    {
        var parts = new List<string>();
        var model = System.Text.RegularExpressions.Regex.Match(table.Metadata.GetValueOrDefault(ScanMetadata.ModelText) ?? "", @"(?m)^\s*name\s*=\s*""([^""]+)""");
        if (model.Success) parts.Add(model.Groups[1].Value);
        if (grid.FixedTemperatureK is { } t) parts.Add(FormattableString.Invariant($"T = {t:G4} K"));
        var mesh = System.Text.RegularExpressions.Regex.Match(table.Metadata.GetValueOrDefault(ScanMetadata.ScanText) ?? "", @"(?m)^\s*mesh\s*=\s*(\d+)");
        if (mesh.Success) parts.Add($"mesh {mesh.Groups[1].Value}");
        return parts.Count > 0 ? "\n" + string.Join(", ", parts) : "";
    }

    /// <summary>Axes with at most this many grid values get one tick per value.</summary>
    private const int MaxLabelledTicks = 14;

    private static ScottPlot.TickGenerators.NumericManual Ticks(double[] values)
    {
        var t = new ScottPlot.TickGenerators.NumericManual();
        foreach (var v in values) t.AddMajor(v, v.ToString("G4", CultureInfo.InvariantCulture));
        return t;
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
