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
}
