using ScottPlot;
using SkiaSharp;

namespace Meanfield.Output;

/// <summary>
/// The house style of meanfield's plots: the bundled DejaVu Sans for all text, 1000 x 700 pixels, axis labels written
/// "quantity (unit)", and the picture format chosen by the file extension (.png, .svg or .pdf, see <see cref="Save"/>), written atomically.
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
        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic { LabelFormatter = Number };
        plot.Axes.Left.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic { LabelFormatter = Number, TargetTickCount = 8 };
        plot.HideGrid();
        return plot;
    }

    /// <summary>
    /// A tick or legend number: invariant culture, no thousands separators, at most six significant digits, the
    /// typographic minus sign (U+2212); exponent form only outside 1e-4..1e6.
    /// </summary>
    public static string Number(double v)
    {
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        double a = Math.Abs(v);
        string text = a == 0 ? "0"
            : a is >= 1e-4 and < 1e6 ? double.Parse(v.ToString("G6", inv), inv).ToString("0.##########", inv)
            : v.ToString("0.#####E+0", inv);
        return text.Replace('-', '\u2212');
    }

    /// <summary>The chemical-potential line's colour: a green that neither end nor the middle of the weight colour scale uses.</summary>
    public static readonly Color ChemicalPotentialColour = new(0, 140, 70);

    /// <summary>The picture formats every plot writer accepts, by file extension.</summary>
    public static readonly IReadOnlyList<string> PictureExtensions = [".png", ".svg", ".pdf"];

    /// <summary>"a .png, .svg or .pdf file name", for option descriptions and messages.</summary>
    public const string PictureKinds = ".png (raster), .svg or .pdf (vector)";

    /// <summary>
    /// Refuses a picture name whose extension is not one of <see cref="PictureExtensions"/>, before anything is
    /// computed or written.
    /// </summary>
    /// <param name="path">The picture's path.</param>
    /// <param name="option">The option that named it, for the message.</param>
    /// <exception cref="OutputPathException">The extension is missing or unknown.</exception>
    public static void CheckPictureName(string path, string option = "--out")
    {
        var ext = Path.GetExtension(path).ToLowerInvariant();
        if (!PictureExtensions.Contains(ext))
            throw new OutputPathException($"{option} {path}: a picture is written as {PictureKinds}; " +
                                          $"'{(ext.Length == 0 ? "(no extension)" : ext)}' is none of them");
    }

    /// <summary>
    /// Saves a plot in the format its extension names, through a temporary file: .png through Skia's raster surface,
    /// .svg through Skia's SVG canvas (paths and text, no embedded bitmap), .pdf through Skia's PDF document (one page,
    /// one point per pixel, fonts embedded).
    /// </summary>
    /// <exception cref="OutputPathException">The extension is not .png, .svg or .pdf; nothing is written.</exception>
    public static void Save(Plot plot, string path, int width = Width, int height = Height) =>
        SavePanels([plot], path, width, height);

    /// <summary>
    /// Saves plots side by side, each <paramref name="panelWidth"/> x <paramref name="height"/>, as one picture in the
    /// format its extension names (see <see cref="Save"/>): every format keeps the panels vector where it can.
    /// </summary>
    /// <exception cref="OutputPathException">The extension is not .png, .svg or .pdf; nothing is written.</exception>
    public static void SavePanels(IReadOnlyList<Plot> panels, string path, int panelWidth = Width, int height = Height)
    {
        CheckPictureName(path, "picture");
        int width = panelWidth * panels.Count;
        void Draw(SKCanvas canvas)
        {
            canvas.Clear(SKColors.White);
            for (int i = 0; i < panels.Count; i++)
            {
                canvas.Save();
                canvas.Translate(i * panelWidth, 0);
                canvas.ClipRect(new SKRect(0, 0, panelWidth, height));
                panels[i].Render(canvas, panelWidth, height);
                canvas.Restore();
            }
        }
        switch (Path.GetExtension(path).ToLowerInvariant())
        {
            case ".png":
            {
                using var surface = SKSurface.Create(new SKImageInfo(width, height))
                    ?? throw new InvalidOperationException($"picture {path}: Skia could not create a {width} x {height} surface");
                Draw(surface.Canvas);
                using var image = surface.Snapshot();
                using var data = image.Encode(SKEncodedImageFormat.Png, 100);
                AtomicFile.Write(path, s => data.SaveTo(s));
                break;
            }
            case ".svg":
                AtomicFile.Write(path, s =>
                {
                    // The SVG canvas writes its closing tag when disposed, so it must be disposed before the stream is.
                    using var managed = new SKManagedWStream(s);
                    using (var canvas = SKSvgCanvas.Create(new SKRect(0, 0, width, height), managed)) Draw(canvas);
                });
                break;
            default:
                AtomicFile.Write(path, s =>
                {
                    using var managed = new SKManagedWStream(s);
                    using var document = SKDocument.CreatePdf(managed)
                        ?? throw new InvalidOperationException($"picture {path}: this SkiaSharp build has no PDF back end");
                    Draw(document.BeginPage(width, height));
                    document.EndPage();
                    document.Close();
                });
                break;
        }
    }
}
