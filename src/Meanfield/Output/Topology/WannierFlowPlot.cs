using System.Globalization;
using System.Text;
using Meanfield.Analysis.Topology;
using ScottPlot;

namespace Meanfield.Output.Topology;

/// <summary>
/// The Wannier-centre flow of a Z2 calculation: the planes side by side, each over its half pump range, centres as
/// dots (x = plane index + 2 x pump, y = centre in units of the lattice vector), the plane and its Z2 above each panel.
/// A table of the same data (CSV: plane, fixed axis and value, pump, centre index, centre) goes next to it.
/// </summary>
public static class WannierFlowPlot
{
    /// <summary>Saves the picture (.png or .svg).</summary>
    public static void Save(IReadOnlyList<WannierFlow> flows, string path, string title)
    {
        var plot = PlotStyle.NewPlot(title, "pump parameter per plane (0 … ½)", "Wannier centre (lattice vector)");
        const string names = "123";
        for (int p = 0; p < flows.Count; p++)
        {
            var f = flows[p];
            var xs = new List<double>(); var ys = new List<double>();
            for (int i = 0; i < f.Pump.Count; i++)
                foreach (var c in f.Centres[i]) { xs.Add(p + 2 * f.Pump[i]); ys.Add(c); }
            var dots = plot.Add.ScatterPoints(xs.ToArray(), ys.ToArray(), Colors.Navy);
            dots.MarkerSize = 4;
            if (p > 0) plot.Add.VerticalLine(p, 1, Colors.Gray, LinePattern.Solid);
            string fixedText = flows.Count == 1 ? "2D zone" : $"u{names[f.FixedAxis]} = {(f.FixedValue == 0 ? "0" : "½")}";
            var label = plot.Add.Text($"{fixedText}: Z2 = {f.Z2}{(f.Resolved ? "" : " (unresolved)")}", p + 0.5, 1.04);
            label.LabelFontSize = PlotStyle.TickFontSize;
            label.LabelAlignment = Alignment.LowerCenter;
        }
        plot.Axes.SetLimits(0, flows.Count, 0, 1.12);
        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
            Enumerable.Range(0, flows.Count + 1).Select(i => (double)i).ToArray(),
            Enumerable.Range(0, flows.Count + 1).Select(i => i == 0 ? "0" : "½|0").ToArray());
        PlotStyle.Save(plot, path, Math.Max(PlotStyle.Width, 260 * flows.Count), PlotStyle.Height);
    }

    /// <summary>Writes the flow table as CSV.</summary>
    public static void WriteTable(IReadOnlyList<WannierFlow> flows, string path, IReadOnlyDictionary<string, string> metadata)
    {
        var inv = CultureInfo.InvariantCulture;
        AtomicFile.Write(path, s =>
        {
            using var w = new StreamWriter(s, new UTF8Encoding(false));
            w.WriteLine("# hybrid Wannier charge centres in units of the lattice vector along the loop axis; axes 0,1,2 = b1,b2,b3; "
                        + string.Join("; ", metadata.Select(kv => $"{kv.Key}={kv.Value}")));
            w.WriteLine("plane,fixed_axis,fixed_value,pump_axis,loop_axis,pump,index,centre,plane_z2");
            for (int p = 0; p < flows.Count; p++)
            {
                var f = flows[p];
                for (int i = 0; i < f.Pump.Count; i++)
                    for (int c = 0; c < f.Centres[i].Length; c++)
                        w.WriteLine(string.Create(inv, $"{p},{f.FixedAxis},{f.FixedValue:R},{f.PumpAxis},{f.LoopAxis},{f.Pump[i]:R},{c},{f.Centres[i][c]:R},{f.Z2}"));
            }
        });
    }
}
