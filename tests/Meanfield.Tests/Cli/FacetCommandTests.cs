using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

/// <summary>End-to-end checks of `facet` (small slabs and grids) and its bad-input rules: exit 2, nothing written.</summary>
public sealed class FacetCommandTests
{
    [Fact]
    public void Slab_view_writes_a_table_with_units_and_a_picture()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml.Replace("dt = 0", "dt = 0.4"));
        var csv = cli.PathOf("slab.csv");
        Assert.Equal(ExitCodes.Success, cli.Run("facet", model, "--plane", "1,1,1", "--top", "B", "--layers", "6", "--points", "30", "--out", csv));
        Assert.True(File.Exists(cli.PathOf("slab.png")));
        var lines = File.ReadAllLines(csv);
        Assert.Contains("# energy_unit = eV", lines);
        Assert.Contains(lines, l => l.StartsWith("# hamiltonian = bare model"));
        Assert.Contains("# surface_lattice = hexagonal", lines);
        var body = lines.SkipWhile(l => l.StartsWith('#')).ToArray();
        Assert.Equal("k_index,path_length_per_angstrom,kx_per_angstrom,ky_per_angstrom,kz_per_angstrom,label,band,energy_eV,energy_minus_mu_eV,top_weight,bottom_weight", body[0]);
        // 30 k-points x (6 layers x 4 bands) rows.
        Assert.Equal(30 * 24, body.Length - 1);
        Assert.Contains("hexagonal surface zone", cli.Out);
    }

    [Fact]
    public async Task Arc_map_of_a_solved_model_says_it_uses_the_bulk_saddle_point()
    {
        using var cli = new CliHarness();
        var pq = cli.PathOf("arcs.parquet");
        Assert.Equal(ExitCodes.Success, cli.Run("facet", CliHarness.ShippedModel("kondo-insulator-sc.toml"), "--mesh", "8", "--plane", "0,0,1",
            "--view", "arcs", "--grid", "6", "--out", pq));
        Assert.True(File.Exists(cli.PathOf("arcs.png")));
        await using var stream = File.OpenRead(pq);
        await using var reader = await Parquet.ParquetReader.CreateAsync(stream);
        Assert.Equal(36, reader.Metadata!.NumRows);
        Assert.Equal("meV", reader.CustomMetadata["energy_unit"]);
        Assert.Contains("bulk saddle point", reader.CustomMetadata["hamiltonian"]);
        Assert.Equal("1/meV", reader.CustomMetadata["unit.surface_per_meV"]);
        Assert.Equal("0", reader.CustomMetadata["not_converged_points"]);
    }

    public static TheoryData<string, string[], string> BadInputs => new()
    {
        { "fkm", ["--plane", "0,0,0"], "do not define a lattice plane" },
        { "fkm", ["--plane", "1,1"], "three integers" },
        { "fkm", ["--plane", "1,1,1", "--top", "C"], "no such site" },
        { "fkm", ["--plane", "1,1,1", "--layers", "1"], "at least 2" },
        { "2d", ["--plane", "0,0,1", "--bare"], "3D model" },
        { "fkm", ["--plane", "1,1,1", "--eta", "-1", "--view", "spectrum"], "eta" },
    };

    [Theory]
    [MemberData(nameof(BadInputs))]
    public void Bad_input_exits_2_and_writes_nothing(string which, string[] args, string message)
    {
        using var cli = new CliHarness();
        var model = which == "fkm" ? cli.Write("fkm.toml", CliHarness.FuKaneMeleToml) : CliHarness.ShippedModel("honeycomb-2d.toml");
        var before = cli.Files();
        Assert.Equal(ExitCodes.BadInput, cli.Run(["facet", model, .. args, "--out", cli.PathOf("s.csv")]));
        Assert.Contains(message, cli.Err);
        Assert.Equal(before, cli.Files());
    }
}
