using System.CommandLine;
using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

/// <summary>
/// What the exit code says: a bad value the user gave that only the library can judge is bad input (2, the message
/// naming the option and the value); an ArgumentException that escapes is a bug of ours (70), never bad input.
/// </summary>
public sealed class ExitCodeTests
{
    [Fact]
    public void Heat_with_the_lowest_temperature_above_the_highest_exits_2_naming_both_options()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.BadInput, cli.Run("heat", model, "--mesh", "4", "--tmin", "5K", "--tmax", "1K", "--out", cli.PathOf("heat.csv")));
        Assert.Contains("--tmin 5 K", cli.Err);
        Assert.Contains("--tmax 1 K", cli.Err);
        Assert.DoesNotContain("internal error", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Fact]
    public void Band_path_with_an_unknown_label_exits_2_naming_the_option_and_the_label()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.BadInput, cli.Run("bands", model, "--path", "G X Q", "--points", "20", "--out", cli.PathOf("b.csv")));
        Assert.Contains("--path \"G X Q\"", cli.Err);
        Assert.Contains("'Q'", cli.Err);
        Assert.Contains("valid labels", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Fact]
    public void Band_path_with_too_few_points_for_its_legs_exits_2_naming_points()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.BadInput, cli.Run("bands", model, "--path", "G X W L G", "--points", "3", "--out", cli.PathOf("b.csv")));
        Assert.Contains("--points 3", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Fact]
    public void Facet_plane_0_0_0_exits_2_naming_the_option()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.BadInput, cli.Run("facet", model, "--plane", "0,0,0", "--out", cli.PathOf("s.csv")));
        Assert.Contains("--plane 0,0,0", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Fact]
    public void A_mesh_too_large_for_any_machine_exits_2_naming_the_mesh()
    {
        // 2000^3 = 8e9 k-points: more than one mesh can index (2^31), whatever the memory.
        using var cli = new CliHarness();
        Assert.Equal(ExitCodes.BadInput, cli.Run("solve", CliHarness.ShippedModel("kondo-insulator-sc.toml"), "--mesh", "2000", "--out", cli.PathOf("s.json")));
        Assert.Contains("mesh 2000", cli.Err);
        Assert.Contains("--mesh", cli.Err);
        Assert.Empty(cli.Files());
    }

    [Fact]
    public void Response_mesh_out_of_range_exits_2_naming_kmesh()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.BadInput, cli.Run("hall", model, "--window", "-1", "1", "--kmesh", "1", "--out", cli.PathOf("h.csv")));
        Assert.Contains("--kmesh 1", cli.Err);
    }

    [Fact]
    public void Hall_window_reaching_infinity_exits_2_naming_the_window()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.BadInput, cli.Run("hall", model, "--window", "-1", "Infinity", "--kmesh", "2", "--out", cli.PathOf("h.csv")));
        Assert.Contains("--window", cli.Err);
        Assert.DoesNotContain("internal error", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Theory]
    [InlineData("-1")]
    [InlineData("1e-300")] // below the double spacing the bisection's midpoint equals an end: it would never stop
    public void Kondo_scale_with_a_tolerance_it_cannot_reach_exits_2_instead_of_running_forever(string tolerance)
    {
        using var cli = new CliHarness();
        Assert.Equal(ExitCodes.BadInput, cli.Run("kondo-scale", CliHarness.ShippedModel("kondo-insulator-sc.toml"), "--mesh", "4", "--relative-tolerance", tolerance));
        Assert.Contains("--relative-tolerance", cli.Err);
    }

    [Fact]
    public void An_argument_exception_escaping_a_command_is_an_internal_error_not_bad_input()
    {
        var boom = new Command("boom", "test only: a library precondition our own code violated");
        boom.SetAction(new Func<ParseResult, int>(_ => throw new ArgumentException("span of 3 entries for a 4 x 4 matrix")));
        var root = new RootCommand { boom };
        using var o = new StringWriter();
        using var e = new StringWriter();
        Assert.Equal(ExitCodes.Internal, Runner.Run(root, ["boom"], o, e));
        Assert.StartsWith("internal error (please report it", e.ToString());
        Assert.Contains("span of 3 entries", e.ToString());
    }

    [Fact]
    public void A_request_error_escaping_a_command_is_bad_input()
    {
        var refuse = new Command("refuse", "test only: a value the user chose that the library refuses");
        refuse.SetAction(new Func<ParseResult, int>(_ => throw new RequestError("--points 1: need at least 2")));
        var root = new RootCommand { refuse };
        using var o = new StringWriter();
        using var e = new StringWriter();
        Assert.Equal(ExitCodes.BadInput, Runner.Run(root, ["refuse"], o, e));
        Assert.Equal("error: --points 1: need at least 2", e.ToString().Trim());
    }
}
