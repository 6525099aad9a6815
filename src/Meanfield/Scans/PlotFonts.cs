using Meanfield.Output;

namespace Meanfield.Scans;

/// <summary>Phase maps use the bundled font of every other meanfield plot (text renders with no system fonts).</summary>
internal static class PlotFonts
{
    public static void Apply(ScottPlot.Plot plot)
    {
        PlotStyle.EnsureFonts();
        plot.Font.Set(PlotStyle.FontName);
    }
}
