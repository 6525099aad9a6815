using Meanfield.Output;
using Meanfield.Scans;
using Meanfield.Tests.Scans;

namespace Meanfield.Tests.Output;

// Magic bytes: PNG files start with 89 50 4E 47 0D 0A 1A 0A (PNG specification, ISO/IEC 15948:2004, sec. 5.2);
// a PDF file starts with "%PDF-" (ISO 32000-1:2008, sec. 7.5.2); an SVG document's root element is <svg> in the
// namespace http://www.w3.org/2000/svg (W3C, Scalable Vector Graphics 1.1, sec. 5.1.2).
public sealed class PictureFormatTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-picture-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    private static readonly byte[] PngSignature = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];

    private static ScottPlot.Plot Sample() => LinePlot.Build("Invented compound", "Energy", "meV", "DOS", "states / meV",
        [new LineSeries("total", [0.0, 1, 2, 3], [1.0, 3, 2, 4])], verticalLines: [1.5]);

    private static void AssertFormat(string path)
    {
        var bytes = File.ReadAllBytes(path);
        switch (Path.GetExtension(path))
        {
            case ".png": Assert.Equal(PngSignature, bytes[..8]); break;
            case ".pdf": Assert.Equal("%PDF-"u8.ToArray(), bytes[..5]); break;
            default:
                var text = System.Text.Encoding.UTF8.GetString(bytes);
                Assert.Contains("<svg", text);
                Assert.Contains("http://www.w3.org/2000/svg", text);
                Assert.DoesNotContain("<image", text);          // vector paths, not an embedded bitmap
                Assert.NotEqual(PngSignature, bytes[..8]);
                break;
        }
    }

    [Theory]
    [InlineData(".png")]
    [InlineData(".svg")]
    [InlineData(".pdf")]
    public void Every_extension_writes_what_it_says(string ext)
    {
        var path = Path.Combine(_dir, "plot" + ext);
        PlotStyle.Save(Sample(), path, 400, 300);
        AssertFormat(path);
    }

    [Theory]
    [InlineData(".svg")]
    [InlineData(".pdf")]
    public void Side_by_side_panels_stay_vector(string ext)
    {
        var path = Path.Combine(_dir, "panels" + ext);
        PlotStyle.SavePanels([Sample(), Sample()], path, 300, 200);
        AssertFormat(path);
    }

    [Theory]
    [InlineData("m.jpg")]
    [InlineData("m.eps")]
    [InlineData("m")]
    public void Unknown_extension_is_refused_and_nothing_is_written(string name)
    {
        var path = Path.Combine(_dir, name);
        var e = Assert.Throws<OutputPathException>(() => PlotStyle.Save(Sample(), path));
        Assert.Contains(".svg", e.Message);
        Assert.Empty(Directory.GetFiles(_dir));
    }

    [Theory]
    [InlineData(".png")]
    [InlineData(".svg")]
    [InlineData(".pdf")]
    public async Task Phase_map_writes_what_its_extension_says(string ext)
    {
        string data = Path.Combine(_dir, "scan.parquet");
        await ScanRunner.RunAsync(ScanTestData.Grid(4, 3), new FakeSolver().Solve, new ScanOutput(data, ScanTestData.Provenance()),
                                  new ScanRunOptions(), null, CancellationToken.None);
        var path = Path.Combine(_dir, "map" + ext);
        PhaseMap.Save(data, "V", "ratio", "phase", path, new PhaseMapOptions { Width = 400, Height = 300 });
        AssertFormat(path);
    }
}
