using ScottPlot;

namespace Meanfield.Output;

/// <summary>
/// The house style of meanfield's plots: the bundled DejaVu Sans for all text, 1000 x 700 pixels, axis labels written
/// "quantity (unit)", and the image format chosen by the file extension (.png or .svg), written atomically.
/// </summary>
public static class PlotStyle
{
    public const string FontName = BundledFontResolver.FamilyName;
    public const int Width = 1000;
    public const int Height = 700;
    public const float LabelFontSize = 18;
    public const float TickFontSize = 14;

    private static readonly object Gate = new();
    private static bool _fontsReady;

    /// <summary>Registers the bundled font with ScottPlot ahead of the system fonts and makes it the default (idempotent).</summary>
    public static void EnsureFonts()
    {
        lock (Gate)
        {
            if (_fontsReady) return;
            Fonts.FontResolvers.Insert(0, new BundledFontResolver());
            Fonts.Default = FontName; Fonts.Sans = FontName;
            _fontsReady = true;
        }
    }

    /// <summary>"Energy (meV)", or just the quantity when it has no unit.</summary>
    public static string AxisLabel(string quantity, string? unit) => string.IsNullOrEmpty(unit) ? quantity : $"{quantity} ({unit})";

    /// <summary>A new plot with the house fonts and sizes, no grid, and the given title and axis labels.</summary>
    public static Plot NewPlot(string title, string xLabel, string yLabel)
    {
        EnsureFonts();
        var plot = new Plot();
        plot.Font.Set(FontName);
        plot.Legend.SetBestFontOnEachRender = false;
        plot.Legend.FontName = FontName;
        plot.Legend.FontSize = TickFontSize;
        plot.Title(title, LabelFontSize + 2);
        plot.XLabel(xLabel, LabelFontSize);
        plot.YLabel(yLabel, LabelFontSize);
        plot.Axes.Bottom.TickLabelStyle.FontSize = TickFontSize;
        plot.Axes.Left.TickLabelStyle.FontSize = TickFontSize;
        plot.Axes.Bottom.TickGenerator = PlainTicks();
        plot.Axes.Left.TickGenerator = PlainTicks();
        plot.HideGrid();
        return plot;
    }

    /// <summary>Automatic numeric ticks written without thousands separators (1100, not 1,100), invariant culture.</summary>
    public static ScottPlot.TickGenerators.NumericAutomatic PlainTicks() => new() { LabelFormatter = PlainNumber };

    /// <summary>A tick value as plain digits: "1100", "0.25", "-3.5e-05".</summary>
    public static string PlainNumber(double v) =>
        v == 0 ? "0" : Math.Abs(v) is >= 1e-3 and < 1e7 ? v.ToString("0.####", System.Globalization.CultureInfo.InvariantCulture)
                     : v.ToString("G3", System.Globalization.CultureInfo.InvariantCulture);

    /// <summary>Saves as PNG or SVG by extension, through a temporary file.</summary>
    /// <exception cref="ArgumentException">The extension is neither .png nor .svg.</exception>
    public static void Save(Plot plot, string path, int width = Width, int height = Height)
    {
        var ext = Path.GetExtension(path).ToLowerInvariant();
        byte[] bytes = ext switch
        {
            ".png" => plot.GetImageBytes(width, height, ImageFormat.Png),
            ".svg" => System.Text.Encoding.UTF8.GetBytes(plot.GetSvgXml(width, height)),
            _ => throw new ArgumentException($"Plot '{path}': unknown extension '{ext}'; use .png or .svg."),
        };
        AtomicFile.Write(path, s => s.Write(bytes));
    }
}
