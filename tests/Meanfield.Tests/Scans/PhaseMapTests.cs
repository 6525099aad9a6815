using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

// PNG files start with the 8-byte signature 89 50 4E 47 0D 0A 1A 0A (PNG specification, ISO/IEC 15948:2004, sec. 5.2).
public sealed class PhaseMapTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-phasemap-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    [Theory]
    [InlineData("phase", null)]
    [InlineData("r_f", "mu")]
    public async Task Writes_a_png_for_categorical_and_numeric_colouring(string colorBy, string? contour)
    {
        string data = Path.Combine(_dir, "scan.parquet");
        await ScanRunner.RunAsync(ScanTestData.Grid(6, 5), new FakeSolver().Solve, new ScanOutput(data, ScanTestData.Provenance()),
                                  new ScanRunOptions(), null, CancellationToken.None);
        string png = Path.Combine(_dir, colorBy + ".png");
        PhaseMap.Save(data, "V", "ratio", colorBy, png, new PhaseMapOptions { ContourColumn = contour, Width = 400, Height = 300 });
        var bytes = File.ReadAllBytes(png);
        Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, bytes[..8]);
        Assert.True(bytes.Length > 2000);
    }

    [Fact]
    public async Task Unknown_column_is_named_with_a_suggestion()
    {
        string data = Path.Combine(_dir, "scan.parquet");
        await ScanRunner.RunAsync(ScanTestData.Grid(3, 3), new FakeSolver().Solve, new ScanOutput(data, ScanTestData.Provenance()),
                                  new ScanRunOptions(), null, CancellationToken.None);
        var e = Assert.Throws<ScanError>(() => PhaseMap.Save(data, "V", "ratio", "phse", Path.Combine(_dir, "x.png")));
        Assert.Contains("did you mean 'phase'", e.Message);
    }

    // SVG is XML with an <svg> root element (W3C SVG 1.1, sec. 5.1): a vector file, not PNG bytes under that name.
    [Fact]
    public async Task An_svg_name_gets_a_vector_file_and_an_unknown_extension_is_refused()
    {
        string data = Path.Combine(_dir, "scan.parquet");
        await ScanRunner.RunAsync(ScanTestData.Grid(3, 3), new FakeSolver().Solve, new ScanOutput(data, ScanTestData.Provenance()),
                                  new ScanRunOptions(), null, CancellationToken.None);
        string svg = Path.Combine(_dir, "m.svg");
        PhaseMap.Save(data, "V", "ratio", "phase", svg);
        string text = File.ReadAllText(svg);
        Assert.Contains("<svg", text);
        Assert.DoesNotContain("PNG", text[..Math.Min(200, text.Length)]);
        Assert.Contains("Weyl semimetal", text); // readable phase names in the legend, not file forms
        string pdf = Path.Combine(_dir, "m.pdf");
        Assert.ThrowsAny<ArgumentException>(() => PhaseMap.Save(data, "V", "ratio", "phase", pdf));
        Assert.False(File.Exists(pdf));
    }

    [Fact]
    public void Every_phase_has_a_readable_name()
    {
        foreach (var p in Enum.GetValues<Meanfield.Analysis.Phase>())
        {
            string file = Meanfield.Analysis.PhaseClassifier.Name(p), words = Meanfield.Analysis.PhaseClassifier.Readable(file);
            Assert.NotEqual(file, words);
            Assert.DoesNotContain("-", words);
        }
        Assert.Equal(Enum.GetValues<Meanfield.Analysis.Phase>().Length,
                     Enum.GetValues<Meanfield.Analysis.Phase>().Select(p => Meanfield.Analysis.PhaseClassifier.Readable(Meanfield.Analysis.PhaseClassifier.Name(p))).Distinct().Count());
    }
}
