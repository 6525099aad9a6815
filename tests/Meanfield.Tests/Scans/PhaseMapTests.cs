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
        string gif = Path.Combine(_dir, "m.gif");
        Assert.Throws<Meanfield.Output.OutputPathException>(() => PhaseMap.Save(data, "V", "ratio", "phase", gif));
        Assert.False(File.Exists(gif));
    }
}

public sealed class PhaseMapLabelTests
{
    [Fact]
    public void Every_phase_has_a_distinct_readable_name()
    {
        var names = Enum.GetValues<Meanfield.Analysis.Phase>().Select(p => Meanfield.Analysis.PhaseClassifier.Readable(p)).ToList();
        Assert.Equal(names.Count, names.Distinct().Count());
        Assert.All(names, n => { Assert.False(string.IsNullOrWhiteSpace(n)); Assert.DoesNotContain('-', n.Replace("(2D)", "")); });
        Assert.Equal("strong topological Kondo insulator", Meanfield.Analysis.PhaseClassifier.Readable("strong-topological-kondo-insulator"));
        Assert.Equal("Weyl semimetal with pockets", Meanfield.Analysis.PhaseClassifier.Readable("weyl-semimetal-with-pockets"));
        Assert.Equal("some-other-text", Meanfield.Analysis.PhaseClassifier.Readable("some-other-text"));
    }

    [Fact]
    public void Axes_are_titled_with_units_and_free_variables_by_their_tie()
    {
        var grid = ScanTestData.Grid(3, 3);   // V in the model's unit; ratio free, tied as m = ratio * lso
        Assert.Equal("V (meV)", PhaseMapLabels.AxisTitle(grid.Axes[0], grid, "meV"));
        Assert.Equal("m / lso", PhaseMapLabels.AxisTitle(grid.Axes[1], grid, "meV"));
        var other = new ScanGrid([new ScanAxis("x", [1.0, 2], IsFreeVariable: true)], ties: [new("m", "x^2 + 1")]);
        Assert.Equal("x  (m = x^2 + 1)", PhaseMapLabels.AxisTitle(other.Axes[0], other, "meV"));
        var t = new ScanAxis("T", [1.0, 2], Unit: "K", KelvinPerUnit: 1);
        Assert.Equal("T (K)", PhaseMapLabels.AxisTitle(t, other, "meV"));
    }

    [Theory]
    [InlineData(180, 340, new[] { 200.0, 225, 250, 275, 300, 325 })]
    [InlineData(0, 20, new[] { 0.0, 5, 10, 15, 20 })]
    [InlineData(1000, 5000, new[] { 1000.0, 2000, 3000, 4000, 5000 })]
    public void Ticks_are_round_and_inside_the_grid(double lo, double hi, double[] expected)
    {
        Assert.Equal(expected, PhaseMap.TickPositions(lo, hi), (a, b) => Math.Abs(a - b) < 1e-9);
        Assert.Equal("5000", PhaseMap.TickLabel(5000));   // no thousands separators
        Assert.Equal("0.25", PhaseMap.TickLabel(0.25));
    }

    // A log axis from 5 to 1000 (the T axis of the shipped T-V scan) carries major ticks at 1, 2 and 5 times each
    // power of ten inside it and minor ticks at the other multiples (common practice for logarithmic axes).
    [Fact]
    public void Log_axes_have_major_ticks_at_one_two_five_per_decade()
    {
        var ticks = PhaseMap.LogTickPositions(Math.Log10(5), Math.Log10(1000));
        var major = ticks.Where(t => t.Major).Select(t => Math.Round(Math.Pow(10, t.Log10), 6)).ToArray();
        Assert.Equal([5.0, 10, 20, 50, 100, 200, 500, 1000], major);
        Assert.Equal(4 + 6 + 6 + 0, ticks.Count(t => !t.Major)); // 6..9, 30,40,60..90, 300,400,600..900
    }
}
