using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

/// <summary>End-to-end checks of `invariants`, `hall` and `dipole` on the bare Fu-Kane-Mele test lattice (small meshes).</summary>
public sealed class TopologyCommandTests
{
    /// <summary>Fu, Kane &amp; Mele, PRL 98, 106803 (2007): dt &gt; 0 strong (1;111), dt &lt; 0 weak (0;111).</summary>
    [Theory]
    [InlineData("0.4", "(1;111)", "strong")]
    [InlineData("-0.4", "(0;111)", "weak")]
    public void InvariantsPrintBothMethodsAndWriteTheFlow(string dt, string indices, string kind)
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var png = cli.PathOf("flow.png");
        Assert.Equal(ExitCodes.Success, cli.Run("invariants", model, "--set", $"dt={dt}", "--gap-mesh", "8", "--loop-points", "16", "--flow", png));
        Assert.Contains($"parity formula (inversion centre", cli.Out);
        Assert.Contains($"Wannier-centre flow: {indices}", cli.Out);
        Assert.Contains($"indices {indices} -> {kind}", cli.Out);
        Assert.True(new FileInfo(png).Length > 1000);
        var rows = File.ReadAllLines(cli.PathOf("flow.csv"));
        Assert.StartsWith("#", rows[0]);
        Assert.Equal("plane,fixed_axis,fixed_value,pump_axis,loop_axis,pump,index,centre,plane_z2", rows[1]);
    }

    [Fact]
    public void GaplessSpectrumGetsNoAnswerAndExitFour()
    {
        // Equal bonds: Dirac points at X (Fu, Kane & Mele 2007), so there is no invariant to give.
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.NoAnswer, cli.Run("invariants", model, "--gap-mesh", "8", "--flow", cli.PathOf("flow.png")));
        Assert.Contains("no invariant", cli.Err);
        Assert.DoesNotContain("indices", cli.Out);
        Assert.False(File.Exists(cli.PathOf("flow.png")));
    }

    [Fact]
    public void HallOfATimeReversalInvariantModelVanishesAndTheTableHasUnits()
    {
        // With time reversal Omega(-k) = -Omega(k), so sigma = 0 at every mu (Xiao, Chang & Niu, RMP 82, 1959 (2010)).
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var csv = cli.PathOf("sigma.csv");
        Assert.Equal(ExitCodes.Success, cli.Run("hall", model, "--set", "dt=0.4", "--set", "m=0.1", "--window", "-1", "1", "--mu-points", "5",
            "--kmesh", "6", "--out", csv));
        var lines = File.ReadAllLines(csv);
        Assert.Contains("# conductivity_unit = S/cm", lines);
        Assert.Contains("# column sigma_xy_S_per_cm [S/cm]: anomalous Hall conductivity sigma_xy", lines);
        var header = lines.First(l => !l.StartsWith('#'));
        Assert.Equal("mu_eV,mu_minus_mu0_eV,temperature_K,sigma_yz_S_per_cm,sigma_zx_S_per_cm,sigma_xy_S_per_cm", header);
        foreach (var row in lines.SkipWhile(l => l != header).Skip(1))
            foreach (var v in row.Split(',').Skip(3)) Assert.True(Math.Abs(double.Parse(v, System.Globalization.CultureInfo.InvariantCulture)) < 1e-6);
        Assert.True(File.Exists(cli.PathOf("sigma.png")));
    }

    [Fact]
    public async Task DipoleReportsAllowedComponentsAndWritesParquet()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var pq = cli.PathOf("d.parquet");
        Assert.Equal(ExitCodes.Success, cli.Run("dipole", model, "--set", "dt=0.4", "--set", "m=0.1", "--window", "-1", "1", "--mu-points", "3",
            "--temperatures", "0.1", "--kmesh", "6", "--out", pq));
        // C3v (zincblende with a [111] distortion): one antisymmetric tensor, zero diagonal (group theory, common practice).
        Assert.Contains("point group of 6 operations", cli.Out);
        Assert.Contains("allowed independent tensors: 1; forbidden components: xx yy zz", cli.Out);
        await using var stream = File.OpenRead(pq);
        await using var reader = await Parquet.ParquetReader.CreateAsync(stream);
        Assert.Equal("1", reader.CustomMetadata["dipole_unit"]);
        Assert.Equal(3, reader.Metadata!.NumRows);
        Assert.Contains("D_xy", reader.Schema.DataFields.Select(f => f.Name));
        Assert.Equal("1", reader.CustomMetadata["unit.D_xy"]);
    }

    [Fact]
    public void DipoleRefusesZeroTemperatureWithoutWritingAFile()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var csv = cli.PathOf("d.csv");
        Assert.Equal(ExitCodes.BadInput, cli.Run("dipole", model, "--window", "-1", "1", "--temperatures", "0", "--out", csv));
        Assert.Contains("--temperatures", cli.Err);
        Assert.False(File.Exists(csv));
    }
}
