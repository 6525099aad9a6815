namespace Meanfield.Scans;

/// <summary>
/// The one place that chooses the plot font. Without an installed font ScottPlot silently draws no text, so the
/// set-up installs DejaVu (Debian fonts-dejavu-core); swap this for the embedded-font helper once it exists.
/// </summary>
internal static class PlotFonts
{
    public const string Family = "DejaVu Sans";

    public static void Apply(ScottPlot.Plot plot)
    {
        ScottPlot.Fonts.Default = Family;
        plot.Font.Set(Family);
    }
}
