using Meanfield.Analysis.Bands;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Output;
using Meanfield.Tests.Analysis.Bands;
using Meanfield.Units;
using SkiaSharp;

namespace Meanfield.Tests.Output;

public sealed class BandPlotTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("bands-plot-").FullName;
    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static BandStructure Bands() => BandStructure.Compute(
        new BlochHamiltonian(TightBindingModels.HybridizedCubic(4.0, 25, 12, 7)),
        BandPath.Default(Lattice.Create(LatticeKind.SimpleCubic, 4.0)).Sample(120));

    private static int DarkPixels(string png)
    {
        using var bmp = SKBitmap.Decode(png);
        int dark = 0;
        for (int y = 0; y < bmp.Height; y++)
            for (int x = 0; x < bmp.Width; x++)
            {
                var c = bmp.GetPixel(x, y);
                if (c.Red + c.Green + c.Blue < 200) dark++;
            }
        return dark;
    }

    [Fact]
    public void BundledFontIsRegisteredFirstAndHasGamma()
    {
        PlotStyle.EnsureFonts();
        Assert.IsType<BundledFontResolver>(ScottPlot.Fonts.FontResolvers[0]);
        Assert.Equal("DejaVu Sans", ScottPlot.Fonts.Default);
        var face = ScottPlot.Fonts.GetTypeface("DejaVu Sans", false, false);
        Assert.Equal("DejaVu Sans", face.FamilyName);
        Assert.True(face.ContainsGlyphs("Γμ"));
    }

    [Fact]
    public void PngHasTextWhereLabelsAreDrawn()
    {
        var b = Bands();
        var withText = Path.Combine(_dir, "bands.png");
        var without = Path.Combine(_dir, "bare.png");
        BandPlot.Save(b, withText, "Invented compound: bare bands", chemicalPotential: -20);
        PlotStyle.Save(BandPlot.Build(b, "", chemicalPotential: -20, labels: false), without); // same window, same lines
        using (var bmp = SKBitmap.Decode(withText)) { Assert.Equal(PlotStyle.Width, bmp.Width); Assert.Equal(PlotStyle.Height, bmp.Height); }
        int text = DarkPixels(withText), bare = DarkPixels(without);
        // Title, axis labels and tick labels add well over a thousand dark pixels at this size.
        Assert.True(text > bare + 1000, $"dark pixels with labels {text}, without {bare}");
    }

    [Fact]
    public void ColouredPlotAndSvgAreWritten()
    {
        var b = Bands();
        var png = Path.Combine(_dir, "bands-f.png");
        BandPlot.Save(b, png, "Invented compound: correlated weight", EnergyUnit.ElectronVolt, chemicalPotential: 0, colourByCorrelatedWeight: true);
        Assert.True(new FileInfo(png).Length > 10_000);
        var svg = Path.Combine(_dir, "bands.svg");
        BandPlot.Save(b, svg, "Invented compound", chemicalPotential: 0);
        var xml = File.ReadAllText(svg);
        Assert.Contains("<svg", xml);
        Assert.Throws<OutputPathException>(() => BandPlot.Save(b, Path.Combine(_dir, "bands.gif"), "x"));
        Assert.Equal(2, Directory.GetFiles(_dir).Length);
    }

    [Fact]
    public void LinePlotWritesAPng()
    {
        var x = Enumerable.Range(0, 50).Select(i => i * 0.1).ToArray();
        var path = Path.Combine(_dir, "line.png");
        LinePlot.Save(path, "Test curves", "Temperature", "K", "C/T", "mJ mol⁻¹ K⁻²",
            [new LineSeries("sin", x, x.Select(Math.Sin).ToArray()), new LineSeries("cos", x, x.Select(Math.Cos).ToArray(), Dashed: true)],
            horizontalLines: [0]);
        Assert.True(new FileInfo(path).Length > 5_000);
    }

    /// <summary>
    /// The default window follows the band data: the correlated weight around mu sets it, so scaling every energy
    /// by 1000 scales the window by 1000 (common practice: the picture of a model must not depend on its unit).
    /// </summary>
    [Fact]
    public void DefaultWindowScalesWithTheBands()
    {
        var b = Bands();
        var w1 = BandPlot.DefaultWindow(b, -20);
        Assert.True(w1.Low < 0 && w1.High > 0, $"window {w1} must hold mu");
        var scaled = BandStructure.Compute(new BlochHamiltonian(TightBindingModels.HybridizedCubic(4.0, 25000, 12000, 7000)),
                                           BandPath.Default(Lattice.Create(LatticeKind.SimpleCubic, 4.0)).Sample(120));
        var w2 = BandPlot.DefaultWindow(scaled, -20000);
        Assert.Equal(1000 * w1.Low, w2.Low, 6);
        Assert.Equal(1000 * w1.High, w2.High, 6);
    }
}
