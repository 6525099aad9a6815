using Meanfield.Cli;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.Cli;

/// <summary>The symmetry and memory plan on the command line: info, check, solve; refusals exit 2 and write nothing.</summary>
public class SymmetryCommandTests
{
    private static readonly string Cubic = CliRun.ModelPath("kondo-insulator-sc.toml");
    private static readonly string Diamond = CliRun.ModelPath("weyl-diamond.toml");

    [Fact]
    public void InfoPrintsTheGroupAndTheReduction()
    {
        var (code, stdout, err) = CliRun.Run("info", Cubic, "--mesh", "8");
        Assert.True(code == ExitCodes.Success, err);
        // m-3m (48 operations) with time reversal: 96 (International Tables Vol. A (2016), Table 3.2.3.2).
        Assert.Contains("group of order 96", stdout);
        Assert.Contains("20 of 512 k-points", stdout);
        Assert.Contains("reduction 25.60x", stdout);
    }

    [Fact]
    public void SolvePrintsTheSymmetryLine()
    {
        var dir = CliRun.TempDir();
        var (code, stdout, err) = CliRun.Run("solve", Diamond, "--mesh", "6", "--out", Path.Combine(dir, "s.json"));
        Assert.True(code == ExitCodes.Success, err);
        Assert.Contains("symmetry     12 operations (6 unitary, 6 with time reversal)", stdout);
        Assert.Contains("x fewer", stdout);
    }

    [Fact]
    public void ABrokenRequestedOperationIsRefusedWithItsLine()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "requested.toml");
        var text = File.ReadAllText(Diamond).Replace("mesh = 16", "mesh = 6\nsymmetry = \"3[111],4[001]\"");
        File.WriteAllText(model, text);
        var outFile = Path.Combine(dir, "s.json");
        var (code, _, err) = CliRun.Run("solve", model, "--out", outFile);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains($"requested.toml:{ModelText.LineOf(text, "symmetry =")}:", err);
        Assert.Contains("solver.symmetry", err);
        Assert.Contains("4[001]", err);
        Assert.False(File.Exists(outFile));
        // The operations the model keeps are accepted.
        File.WriteAllText(model, text.Replace("3[111],4[001]", "3[111],m'[1-10]"));
        var ok = CliRun.Run("solve", model, "--out", outFile);
        Assert.True(ok.Code == ExitCodes.Success, ok.Err);
        Assert.Contains("symmetry     6 operations (3 unitary, 3 with time reversal)", ok.Out);
    }

    [Fact]
    public void AMeshTooLargeForTheMachineIsRefusedWithTheEstimate()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "big.toml");
        File.WriteAllText(model, File.ReadAllText(Cubic).Replace("mesh = 16", "mesh = 4096"));
        var check = CliRun.Run("check", model);
        Assert.Equal(ExitCodes.BadInput, check.Code);
        Assert.Contains("mesh 4096", check.Err);
        Assert.Contains("GB", check.Err);
        var outFile = Path.Combine(dir, "s.json");
        var solve = CliRun.Run("solve", Cubic, "--mesh", "3000", "--out", outFile);
        Assert.Equal(ExitCodes.BadInput, solve.Code);
        Assert.Contains("mesh 3000", solve.Err);
        Assert.Contains("this machine offers", solve.Err);
        Assert.False(File.Exists(outFile));
    }
}
