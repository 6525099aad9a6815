using Meanfield.Analysis.Curvature;
using Meanfield.Lattices;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Map of the Berry curvature on a plane of the zone in Cartesian in-plane coordinates (1/angstrom, equal aspect, so a
/// plane with non-orthogonal spans is drawn as the parallelogram it is): x along span 1, y perpendicular to it in the
/// plane. Each plaquette is a filled polygon (vector in .svg and .pdf) on a diverging colour scale clipped at
/// ±<see cref="ClipQuantile"/> of |Omega|, so the near-singular values beside a node do not wash out the rest; the
/// colour bar says where it clips. Nodes in the plane are marked by chirality with a legend. The title states the
/// plane in reduced coordinates.
/// </summary>
public static class CurvaturePlot
{
    /// <summary>Quantile of |Omega| over the plaquettes at which the colour scale clips.</summary>
    public const double ClipQuantile = 0.98;

    /// <summary>Builds the plot without saving it.</summary>
    /// <param name="map">The curvature map.</param>
    /// <param name="nodes">Nodes in the plane (their s, t).</param>
    /// <param name="title">First title line; the plane is stated on the second.</param>
    public static Plot Build(BerryCurvatureMap map, IReadOnlyList<PlaneNode> nodes, string title)
    {
        var (b1, b2) = CartesianSpans(map);
        var e1 = b1 / b1.Norm;
        var b2Perp = b2 - b2.Dot(e1) * e1;
        var e2 = b2Perp.Norm > 0 ? b2Perp / b2Perp.Norm : map.Normal.Cross(e1);
        (double X, double Y) Xy(double s, double t)
        {
            var k = s * b1 + t * b2;
            return (k.Dot(e1), k.Dot(e2));
        }

        string plane = $"plane ({Reduced(map.Origin)}) + s ({Reduced(map.Span1)}) + t ({Reduced(map.Span2)}), reduced coordinates";
        var plot = PlotStyle.NewPlot(title + "\n" + plane, "k along span 1 (Å⁻¹)", "k in plane, ⊥ span 1 (Å⁻¹)");
        double clip = Clip(map);
        var colormap = new ScottPlot.Colormaps.Balance();
        for (int i = 0; i < map.N1; i++)
            for (int j = 0; j < map.N2; j++)
            {
                double s0 = (double)i / map.N1, s1 = (double)(i + 1) / map.N1, t0 = (double)j / map.N2, t1 = (double)(j + 1) / map.N2;
                var (ax, ay) = Xy(s0, t0); var (bx, by) = Xy(s1, t0); var (cx, cy) = Xy(s1, t1); var (dx, dy) = Xy(s0, t1);
                double v = map.Omega[i, j];
                var fill = double.IsFinite(v) ? colormap.GetColor(0.5 + 0.5 * Math.Clamp(v / clip, -1, 1)) : Colors.LightGray;
                var poly = plot.Add.Polygon([new(ax, ay), new(bx, by), new(cx, cy), new(dx, dy)]);
                poly.FillColor = fill;
                poly.LineColor = fill;   // closes the anti-aliasing seams between plaquettes
                poly.LineWidth = 0.5f;
            }
        var bar = plot.Add.ColorBar(new ClippedScale(colormap, clip));
        bar.Label = $"Berry curvature Ω (Å²), clipped at ±{PlotStyle.Number(double.Parse(clip.ToString("G3", System.Globalization.CultureInfo.InvariantCulture), System.Globalization.CultureInfo.InvariantCulture))}";
        bar.LabelStyle.FontName = PlotStyle.FontName;
        bar.Axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic { LabelFormatter = PlotStyle.Number, TargetTickCount = 9 };

        var kinds = new HashSet<int?>();
        foreach (var n in nodes)
        {
            var (x, y) = Xy(n.S, n.T);
            var (shape, text) = n.Chirality switch
            {
                > 0 => (MarkerShape.FilledTriangleUp, "node, chirality +1"),
                < 0 => (MarkerShape.FilledTriangleDown, "node, chirality −1"),
                0 => (MarkerShape.OpenCircle, "node, chirality 0"),
                _ => (MarkerShape.OpenSquare, "node, chirality undetermined"),
            };
            var marker = plot.Add.Marker(x, y, shape, 16, Colors.Black);
            marker.MarkerStyle.OutlineColor = Colors.White;   // readable on the dark ends of the scale
            marker.MarkerStyle.OutlineWidth = 1.5f;
            if (kinds.Add(n.Chirality is int c ? Math.Sign(c) : null)) marker.LegendText = text;
        }
        if (kinds.Count > 0) plot.ShowLegend(Alignment.UpperRight);

        var corners = new[] { Xy(0, 0), Xy(1, 0), Xy(1, 1), Xy(0, 1) };
        plot.Axes.SetLimits(corners.Min(c => c.X), corners.Max(c => c.X), corners.Min(c => c.Y), corners.Max(c => c.Y));
        plot.Axes.SquareUnits();
        return plot;
    }

    /// <summary>Builds and saves the picture as .png, .svg or .pdf by extension.</summary>
    /// <exception cref="OutputPathException">Another extension; nothing is written.</exception>
    public static void Save(BerryCurvatureMap map, IReadOnlyList<PlaneNode> nodes, string path, string title)
    {
        PlotStyle.CheckPictureName(path, "picture");
        PlotStyle.Save(Build(map, nodes, title), path);
    }

    /// <summary>The clip value: the <see cref="ClipQuantile"/> quantile of the finite |Omega| (1e-300 when all vanish).</summary>
    public static double Clip(BerryCurvatureMap map)
    {
        var a = new List<double>(map.N1 * map.N2);
        foreach (double v in map.Omega) if (double.IsFinite(v)) a.Add(Math.Abs(v));
        if (a.Count == 0) return 1e-300;
        a.Sort();
        return Math.Max(a[(int)Math.Floor(ClipQuantile * (a.Count - 1))], 1e-300);
    }

    // The Cartesian spans of the plane from the plaquette centres (the grid has at least 2 x 2 plaquettes).
    private static (Vec3 B1, Vec3 B2) CartesianSpans(BerryCurvatureMap map)
    {
        var c = map.CentreCartesian;
        var b1 = map.N1 > 1 ? (c[1, 0] - c[0, 0]) * map.N1 : map.Normal.Cross(new Vec3(0, 0, 1));
        var b2 = map.N2 > 1 ? (c[0, 1] - c[0, 0]) * map.N2 : map.Normal.Cross(b1);
        return (b1, b2);
    }

    private static string Reduced(Vec3 v) => $"{PlotStyle.Number(v.X)}, {PlotStyle.Number(v.Y)}, {PlotStyle.Number(v.Z)}";

    /// <summary>What a colour bar needs: the diverging scale over ±clip.</summary>
    private sealed class ClippedScale(IColormap colormap, double clip) : IHasColorAxis
    {
        public IColormap Colormap { get; set; } = colormap;
        public ScottPlot.Range GetRange() => new(-clip, clip);
    }
}
