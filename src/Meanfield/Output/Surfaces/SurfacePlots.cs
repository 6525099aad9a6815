using Meanfield.Analysis.Surfaces;
using Meanfield.Units;
using ScottPlot;

namespace Meanfield.Output.Surfaces;

/// <summary>
/// Pictures of a <see cref="SurfaceReport"/> in the house style (bundled font): slab bands coloured by their face
/// weights (red top face, blue bottom face, purple both, grey bulk); the surface and the bulk-projected spectral function side by
/// side along a path (energy relative to mu) or on the surface zone at mu (Fermi-arc map, zone boundary drawn, projected
/// bulk nodes marked with their net chirality). Spectral functions are drawn on a logarithmic scale over
/// <see cref="Decades"/> decades below their maximum.
/// </summary>
public static class SurfacePlots
{
    /// <summary>Decades of spectral weight shown below the maximum of each panel.</summary>
    public const double Decades = 3.5;

    /// <summary>Draws the report's view into <paramref name="path"/>, as .png, .svg or .pdf by its extension.</summary>
    /// <exception cref="OutputPathException">An extension other than .png, .svg or .pdf; nothing is written.</exception>
    public static void Save(SurfaceReport report, string path, string title)
    {
        PlotStyle.CheckPictureName(path, "picture");
        if (report.Slab is not null) { PlotStyle.Save(SlabPlot(report, title), path); return; }
        var (left, right) = report.Spectrum is not null ? SpectrumPanels(report, title) : MapPanels(report, title);
        PlotStyle.SavePanels([left, right], path);
    }

    private static Plot SlabPlot(SurfaceReport r, string title)
    {
        var s = r.Slab!;
        string u = r.Cut.Model.Unit.Symbol();
        var plot = PlotStyle.NewPlot(title, "Surface wave vector", PlotStyle.AxisLabel("E − μ", u));
        double mu = r.ChemicalPotential, lo = r.Window.Low, hi = r.Window.High;
        // A bulk state has FaceDepth / Layers on each face: colour only the weight beyond that share.
        double share = (double)s.FaceDepth / s.Slab.Layers;
        double Excess(double w) => Math.Max(0, w - share) / (1 - share);
        var segments = new List<(double Order, double X1, double Y1, double X2, double Y2, double Top, double Bottom)>();
        for (int seg = 0; seg < s.Path.SegmentStarts.Count; seg++)
            for (int n = 0; n < s.Bands; n++)
                for (int k = s.Path.SegmentStarts[seg]; k + 1 < s.Path.SegmentEnd(seg); k++)
                {
                    double y1 = s.Energy(k, n) - mu, y2 = s.Energy(k + 1, n) - mu;
                    if (Math.Max(y1, y2) < lo || Math.Min(y1, y2) > hi) continue;
                    double t = Excess(0.5 * (s.Top(k, n) + s.Top(k + 1, n))), b = Excess(0.5 * (s.Bottom(k, n) + s.Bottom(k + 1, n)));
                    segments.Add((t + b, s.Path.Length[k], y1, s.Path.Length[k + 1], y2, t, b));
                }
        // Bulk-like states first, surface states on top.
        foreach (var g in segments.OrderBy(x => x.Order))
        {
            var line = plot.Add.Line(g.X1, g.Y1, g.X2, g.Y2);
            line.LineColor = FaceColour(g.Top, g.Bottom);
            line.LineWidth = g.Order > 0.5 ? 2.4f : 1.2f;
            line.MarkerSize = 0;
        }
        foreach (var (text, t, b) in new[] { ("top face", 1.0, 0.0), ("bottom face", 0.0, 1.0), ("both faces (degenerate)", 0.5, 0.5), ("bulk", 0.0, 0.0) })
        {
            var key = plot.Add.Line(0, double.NaN, 0, double.NaN);
            key.LineColor = FaceColour(t, b); key.LineWidth = 3; key.LegendText = text;
        }
        plot.ShowLegend(Alignment.UpperRight);
        plot.Add.HorizontalLine(0, 1.2f, new Color(200, 0, 0), LinePattern.Dashed);
        PathTicks(plot, s.Path);
        plot.Axes.SetLimits(0, s.Path.Length[s.Path.Count - 1], lo, hi);
        return plot;
    }

    private static (Plot, Plot) SpectrumPanels(SurfaceReport r, string title)
    {
        var p = r.Spectrum!;
        string u = r.Cut.Model.Unit.Symbol();
        double length = p.Path.Length[p.Path.Count - 1];
        double e0 = p.Energies[0] - r.ChemicalPotential, e1 = p.Energies[^1] - r.ChemicalPotential;
        Plot Panel(double[,] a, string name)
        {
            var plot = PlotStyle.NewPlot($"{title}: {name}", "Surface wave vector", PlotStyle.AxisLabel("E − μ", u));
            int nk = a.GetLength(0), ne = a.GetLength(1);
            var z = new double[ne, nk];
            for (int k = 0; k < nk; k++)
                for (int e = 0; e < ne; e++) z[ne - 1 - e, k] = a[k, e];
            AddLogHeatmap(plot, z, new CoordinateRect(0, length, e0, e1), name);
            plot.Add.HorizontalLine(0, 1, new Color(200, 0, 0), LinePattern.Dashed);
            PathTicks(plot, p.Path);
            plot.Axes.SetLimits(0, length, e0, e1);
            return plot;
        }
        return (Panel(p.Surface, "surface A_s"), Panel(p.Bulk, "bulk projected A_b"));
    }

    private static (Plot, Plot) MapPanels(SurfaceReport r, string title)
    {
        var m = r.Map!;
        var zone = r.Cut.Zone;
        double x0 = 1.5 * m.S1[0] - 0.5 * m.S1[1], x1 = 1.5 * m.S1[^1] - 0.5 * m.S1[^2];
        double y0 = 1.5 * m.S2[0] - 0.5 * m.S2[1], y1 = 1.5 * m.S2[^1] - 0.5 * m.S2[^2];
        Plot Panel(double[,] a, string name)
        {
            var plot = PlotStyle.NewPlot($"{title}: {name} at μ", "k along e1 (1/Å)", "k along e2 (1/Å)");
            int n1 = a.GetLength(0), n2 = a.GetLength(1);
            var z = new double[n2, n1];
            for (int i = 0; i < n1; i++)
                for (int j = 0; j < n2; j++) z[n2 - 1 - j, i] = a[i, j];
            AddLogHeatmap(plot, z, new CoordinateRect(x0, x1, y0, y1), name);
            var xs = zone.Boundary.Select(b => b.S1).Append(zone.Boundary[0].S1).ToArray();
            var ys = zone.Boundary.Select(b => b.S2).Append(zone.Boundary[0].S2).ToArray();
            var edge = plot.Add.ScatterLine(xs, ys, new Color(30, 160, 80));
            edge.LineWidth = 1.5f;
            if (a == m.Surface) DrawArcs(plot, r);
            foreach (var n in r.Nodes)
            {
                var mark = plot.Add.Marker(n.S1, n.S2, MarkerShape.OpenCircle, 14, n.Chirality > 0 ? new Color(0, 150, 60) : n.Chirality < 0 ? new Color(230, 120, 0) : Colors.Gray);
                mark.MarkerLineWidth = 2.5f;
                var text = plot.Add.Text(n.Chirality == 0 ? "0" : n.Chirality > 0 ? $"+{n.Chirality}" : $"\u2212{-n.Chirality}", n.S1, n.S2);
                text.LabelFontSize = 16; text.LabelBold = true; text.LabelFontName = PlotStyle.FontName;
                text.LabelFontColor = n.Chirality > 0 ? new Color(0, 120, 50) : n.Chirality < 0 ? new Color(200, 90, 0) : Colors.Gray;
                text.LabelAlignment = Alignment.LowerLeft;
                text.OffsetX = 8; text.OffsetY = -6;
            }
            foreach (var (label, k) in zone.Points)
            {
                var (s1, s2) = zone.MapCoordinates(k);
                var t = plot.Add.Text(SurfaceZone.Display(label), s1, s2);
                t.LabelFontSize = 15; t.LabelFontName = PlotStyle.FontName; t.LabelFontColor = new Color(30, 120, 60);
                t.LabelAlignment = Alignment.UpperCenter;
            }
            plot.Axes.SetLimits(x0, x1, y0, y1);
            plot.Axes.SquareUnits();
            return plot;
        }
        return (Panel(m.Surface, "surface A_s"), Panel(m.Bulk, "bulk projected A_b"));
    }

    // Traced Fermi arcs (which nodes each joins) as thin dashed lines, broken where they fold across the zone edge;
    // counting loops as dotted circles.
    private static void DrawArcs(Plot plot, SurfaceReport r)
    {
        var ink = new Color(20, 20, 20);
        double jump = 0.25 * Math.Min(r.Cut.Zone.B1.Norm, r.Cut.Zone.B2.Norm);
        foreach (var arc in r.Arcs)
        {
            var piece = new List<(double X, double Y)>();
            void Flush()
            {
                if (piece.Count > 1)
                {
                    var line = plot.Add.ScatterLine(piece.Select(q => q.X).ToArray(), piece.Select(q => q.Y).ToArray(), ink);
                    line.LineWidth = 1.6f; line.LinePattern = LinePattern.Dashed; line.MarkerSize = 0;
                }
                piece.Clear();
            }
            foreach (var q in arc.Points)
            {
                if (piece.Count > 0 && Math.Abs(q.S1 - piece[^1].X) + Math.Abs(q.S2 - piece[^1].Y) > jump) Flush();
                piece.Add((q.S1, q.S2));
            }
            Flush();
        }
        foreach (var l in r.Loops)
        {
            if (l.Verdict != LoopVerdict.Decided) continue;
            var (cx, cy) = r.Cut.Zone.MapCoordinates(l.Centre);
            var circle = plot.Add.Circle(cx, cy, l.Radius);
            circle.LineColor = ink.WithAlpha(0.6); circle.LineWidth = 1; circle.LinePattern = LinePattern.Dotted; circle.FillColor = Colors.Transparent;
        }
        if (r.Arcs.Count > 0)
        {
            var key = plot.Add.Line(0, double.NaN, 0, double.NaN);
            key.LineColor = ink; key.LinePattern = LinePattern.Dashed; key.LineWidth = 1.6f; key.LegendText = "traced arc";
            plot.ShowLegend(Alignment.MiddleLeft);
        }
    }

    private static void AddLogHeatmap(Plot plot, double[,] z, CoordinateRect rect, string name)
    {
        double max = 0;
        foreach (var v in z) if (double.IsFinite(v)) max = Math.Max(max, v);
        double top = Math.Log10(Math.Max(max, 1e-300)), bottom = top - Decades;
        var log = new double[z.GetLength(0), z.GetLength(1)];
        for (int i = 0; i < z.GetLength(0); i++)
            for (int j = 0; j < z.GetLength(1); j++)
                log[i, j] = Math.Clamp(Math.Log10(Math.Max(z[i, j], 1e-300)), bottom, top);
        var heat = plot.Add.Heatmap(log);
        heat.Colormap = new WeightColormap();
        heat.Rectangle = rect;
        heat.ManualRange = new ScottPlot.Range(bottom, top);
        var bar = plot.Add.ColorBar(heat);
        bar.Axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic { LabelFormatter = PlotStyle.Number };
        bar.Label = $"log10 {name.Split(' ')[^1]} (states per energy unit)";
        bar.LabelStyle.FontName = PlotStyle.FontName;
    }

    private static void PathTicks(Plot plot, Lattices.BandPathSample path)
    {
        double length = path.Length[path.Count - 1];
        foreach (var t in path.Ticks)
            if (t.Position > 0 && t.Position < length) plot.Add.VerticalLine(t.Position, 1, Colors.Gray);
        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
            path.Ticks.Select(t => t.Position).ToArray(),
            path.Ticks.Select(t => string.Join("|", t.Label.Split('|').Select(SurfaceZone.Display))).ToArray());
        plot.Axes.Bottom.TickLabelStyle.FontSize = PlotStyle.LabelFontSize;
    }

    /// <summary>Spectral weight: near-white through steel blue to dark crimson at the peaks.</summary>
    private sealed class WeightColormap : IColormap
    {
        private static readonly (double T, Color C)[] Stops = [(0, new Color(250, 250, 246)), (0.55, new Color(70, 120, 190)), (1, new Color(110, 15, 40))];
        public string Name => "surface-weight";
        public Color GetColor(double position)
        {
            double t = double.IsFinite(position) ? Math.Clamp(position, 0, 1) : 0;
            int i = t <= Stops[1].T ? 0 : 1;
            double f = (t - Stops[i].T) / (Stops[i + 1].T - Stops[i].T);
            var (a, b) = (Stops[i].C, Stops[i + 1].C);
            return new Color((byte)Math.Round(a.R + f * (b.R - a.R)), (byte)Math.Round(a.G + f * (b.G - a.G)), (byte)Math.Round(a.B + f * (b.B - a.B)));
        }
    }

    // Grey for bulk states, mixed towards red by the top-face weight and towards blue by the bottom-face weight
    // (purple: a level shared by both faces).
    private static readonly Color Bulk = new(175, 175, 175), TopFace = new(215, 40, 30), BottomFace = new(30, 90, 200);

    private static Color FaceColour(double top, double bottom)
    {
        double t = Math.Clamp(top, 0, 1), b = Math.Clamp(bottom, 0, 1 - t), g = 1 - t - b;
        byte Mix(byte x, byte y, byte z) => (byte)Math.Round(g * x + t * y + b * z);
        return new Color(Mix(Bulk.R, TopFace.R, BottomFace.R), Mix(Bulk.G, TopFace.G, BottomFace.G), Mix(Bulk.B, TopFace.B, BottomFace.B));
    }
}
