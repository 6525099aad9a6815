using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

// Checks the scan-file format documented in scans/README.md (our own format; TOML 1.0 syntax, toml.io).
public sealed class ScanFileReaderTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-scanfile-").FullName;

    public ScanFileReaderTests()
    {
        Directory.CreateDirectory(Path.Combine(_dir, "models"));
        File.WriteAllText(Path.Combine(_dir, "models", "toy.toml"), "# invented model\n");
        Directory.CreateDirectory(Path.Combine(_dir, "scans"));
    }

    public void Dispose() => Directory.Delete(_dir, true);

    private ScanDefinition Load(string text, IReadOnlyCollection<string>? parameters = null)
    {
        string path = Path.Combine(_dir, "scans", "s.toml");
        File.WriteAllText(path, text);
        return ScanFileReader.Load(path, parameters);
    }

    private ScanFileError Fails(string text, IReadOnlyCollection<string>? parameters = null) =>
        Assert.Throws<ScanFileError>(() => Load(text, parameters));

    private const string Good = """
        model = "../models/toy.toml"
        temperature = "2 K"

        [[axis]]
        name = "V"
        from = 50
        to = 300
        points = 6

        [[axis]]
        name = "ratio"
        values = [0.1, 0.2, 0.4]
        free = true

        [tie]
        m = "ratio * lso"

        [fixed]
        lso = 20

        [solver]
        mesh = 12
        tolerance = 1e-9

        [columns]
        nodes = true
        """;

    [Fact]
    public void Reads_a_complete_file()
    {
        var d = Load(Good);
        Assert.EndsWith(Path.Combine("models", "toy.toml"), d.ModelPath);
        Assert.Equal(2, d.Axes.Count);
        Assert.Equal(new[] { 50.0, 100, 150, 200, 250, 300 }, d.Axes[0].Values);
        Assert.True(d.Axes[1].IsFreeVariable);
        Assert.Equal(2.0, d.TemperatureK);
        Assert.Equal(12, d.Solver.Mesh);
        Assert.Equal(200, d.Solver.MaxIterations);
        Assert.True(d.Columns.Nodes);
        var grid = d.ToGrid();
        Assert.Equal(18, grid.Count);
        var p = grid.Point(grid.PointId([2, 1]));
        Assert.Equal("(0.2) * lso", p.Override("m"));
        Assert.Equal("150", p.Override("V"));
    }

    [Fact]
    public void Temperature_in_meV_is_converted_with_k_B()
    {
        // k_B = 8.617333262e-2 meV/K (CODATA 2018), so 0.5 meV is 5.802259 K.
        var d = Load(Good.Replace("\"2 K\"", "\"0.5 meV\""));
        Assert.Equal(5.802259, d.TemperatureK!.Value, 5);
    }

    [Fact]
    public void Log_axis_is_geometric()
    {
        var d = Load(Good.Replace("points = 6", "points = 3\nspacing = \"log\"").Replace("to = 300", "to = 5000"));
        Assert.Equal(500, d.Axes[0].Values[1], 9);
    }

    [Fact]
    public void Unknown_key_names_line_and_suggests_the_closest()
    {
        var e = Fails(Good.Replace("points = 6", "pionts = 6"));
        Assert.Equal(8, e.Line);
        Assert.Equal("axis.pionts", e.Field);
        Assert.Contains("did you mean 'points'", e.Message);
        Assert.Contains("s.toml:8:", e.Message);
    }

    [Fact]
    public void Unknown_table_is_reported() =>
        Assert.Contains("did you mean 'solver'", Fails(Good.Replace("[solver]", "[solvr]")).Message);

    [Fact]
    public void Zero_points_is_an_error_at_its_line()
    {
        var e = Fails(Good.Replace("points = 6", "points = 0"));
        Assert.Equal(8, e.Line);
        Assert.Contains("zero points", e.Message);
        Assert.Contains("zero points", Fails(Good.Replace("[0.1, 0.2, 0.4]", "[]")).Message);
    }

    [Fact]
    public void Log_spacing_needs_positive_bounds()
    {
        var e = Fails(Good.Replace("from = 50", "from = 0").Replace("points = 6", "points = 6\nspacing = \"log\""));
        Assert.Equal(9, e.Line);
        Assert.Equal("axis.spacing", e.Field);
    }

    [Fact]
    public void Duplicate_axis_names_are_refused()
    {
        var e = Fails(Good.Replace("name = \"ratio\"", "name = \"V\""));
        Assert.Equal(10, e.Line);
        Assert.Contains("duplicate axis 'V' (first on line 4)", e.Message);
    }

    [Fact]
    public void Missing_model_file_is_named()
    {
        var e = Fails(Good.Replace("toy.toml", "nope.toml"));
        Assert.Equal(1, e.Line);
        Assert.Equal("model", e.Field);
        Assert.Contains("nope.toml", e.Message);
    }

    [Fact]
    public void Syntax_error_carries_its_line()
    {
        var e = Fails(Good.Replace("to = 300", "to = = 300"));
        Assert.Equal(7, e.Line);
        Assert.Equal("syntax", e.Field);
    }

    [Fact]
    public void Temperature_must_be_given_once()
    {
        Assert.Equal("temperature", Fails(Good.Replace("temperature = \"2 K\"\n", "")).Field);
        var both = Good.Replace("name = \"V\"", "name = \"T\"\nunit = \"K\"");
        Assert.Equal(2, Fails(both).Line);
    }

    [Fact]
    public void With_model_parameters_free_variables_are_inferred_and_typos_caught()
    {
        string[] parameters = ["t", "dt", "lso", "m", "V", "ef"];
        var d = Load(Good.Replace("free = true\n", ""), parameters);
        Assert.True(d.Axes[1].IsFreeVariable);
        Assert.False(d.Axes[0].IsFreeVariable);
        var e = Fails(Good.Replace("lso = 20", "lsoo = 20"), parameters);
        Assert.Equal("lsoo", e.Field);
        Assert.Contains("did you mean 'lso'", e.Message);
    }

    [Fact]
    public void Temperatures_in_a_scan_file_carry_their_unit()
    {
        // A scan file is not tied to one model's energy unit, so a bare temperature would be ambiguous.
        Assert.Equal("temperature", Fails(Good.Replace("temperature = \"2 K\"", "temperature = 2")).Field);
        Assert.Equal("temperature", Fails(Good.Replace("temperature = \"2 K\"", "temperature = \"2\"")).Field);
        Assert.Equal(2.0, Load(Good.Replace("temperature = \"2 K\"", "temperature = \"2K\"")).TemperatureK!.Value, 12);
        var axis = Good.Replace("temperature = \"2 K\"\n", "").Replace("name = \"V\"", "name = \"T\"");
        Assert.Equal("axis.unit", Fails(axis).Field);
    }
}
