using Meanfield.Analysis.Curvature;
using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// Heatmap of the Berry curvature on a plane against the plane coordinates (s, t), with a symmetric diverging colour
/// scale and a colour bar; nodes in the plane are marked "+" (chirality +1) or "-" (chirality -1), "o" for zero.
/// </summary>
public static class CurvaturePlot
{
    public static void Save(BerryCurvatureMap map, IReadOnlyList<PlaneNode> nodes, string path, string title)
    {
        var plot = PlotStyle.NewPlot(title, "s (along span 1)", "t (along span 2)");
        var z = new double[map.N2, map.N1];
        double max = 0;
        for (int i = 0; i < map.N1; i++)
            for (int j = 0; j < map.N2; j++)
            {
                z[map.N2 - 1 - j, i] = map.Omega[i, j];
                if (double.IsFinite(map.Omega[i, j])) max = Math.Max(max, Math.Abs(map.Omega[i, j]));
            }
        var heat = plot.Add.Heatmap(z);
        heat.Colormap = new ScottPlot.Colormaps.Balance();
        heat.Rectangle = new CoordinateRect(0, 1, 0, 1);
        heat.ManualRange = new ScottPlot.Range(-Math.Max(max, 1e-300), Math.Max(max, 1e-300));
        var bar = plot.Add.ColorBar(heat);
        bar.Label = "Berry curvature (angstrom^2)";
        foreach (var n in nodes)
        {
            var text = plot.Add.Text(n.Chirality > 0 ? "+" : n.Chirality < 0 ? "\u2212" : "o", n.S, n.T);
            text.LabelFontSize = 28;
            text.LabelBold = true;
            text.LabelFontColor = Colors.Black;
            text.LabelAlignment = Alignment.MiddleCenter;
        }
        plot.Axes.SetLimits(0, 1, 0, 1);
        PlotStyle.Save(plot, path);
    }
}
