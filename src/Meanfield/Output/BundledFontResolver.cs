using ScottPlot;
using SkiaSharp;

namespace Meanfield.Output;

/// <summary>
/// Serves DejaVu Sans from the copy embedded in this assembly, so text renders on machines without system fonts
/// (ScottPlot silently draws no text when it finds none). Other font names fall through to the next resolver.
/// </summary>
internal sealed class BundledFontResolver : IFontResolver
{
    public const string FamilyName = "DejaVu Sans";
    private const string ResourceName = "Meanfield.Output.Fonts.DejaVuSans.ttf";

    private static readonly Lazy<SKTypeface> Typeface = new(Load);

    private static SKTypeface Load()
    {
        using var stream = typeof(BundledFontResolver).Assembly.GetManifestResourceStream(ResourceName)
            ?? throw new InvalidOperationException($"Embedded font resource {ResourceName} is missing from the build.");
        using var memory = new MemoryStream();
        stream.CopyTo(memory);
        using var data = SKData.CreateCopy(memory.ToArray());
        return SKTypeface.FromData(data) ?? throw new InvalidOperationException("The embedded DejaVu Sans font could not be read.");
    }

    /// <summary>The embedded typeface (one regular face serves every weight and slant).</summary>
    public static SKTypeface Regular => Typeface.Value;

    public SKTypeface? CreateTypeface(string fontName, FontWeight weight, FontSlant slant, FontSpacing spacing) =>
        string.Equals(fontName, FamilyName, StringComparison.OrdinalIgnoreCase) ? Typeface.Value : null;

    public SKTypeface? CreateTypeface(string fontName, bool bold, bool italic) =>
        CreateTypeface(fontName, FontWeight.Normal, FontSlant.Upright, FontSpacing.Normal);
}
