using System.Text.Json;
using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

public class SolveCommandTests
{
    private static readonly string Model = CliRun.ModelPath("kondo-insulator-sc.toml");

    [Fact]
    public void SolveWritesEveryDocumentedField()
    {
        var dir = CliRun.TempDir();
        var outFile = Path.Combine(dir, "solution.json");
        var (code, stdout, err) = CliRun.Run("solve", Model, "--mesh", "8", "--out", outFile);
        Assert.True(code == ExitCodes.Success, err);
        Assert.Contains("converged", stdout);
        using var doc = JsonDocument.Parse(File.ReadAllText(outFile));
        var root = doc.RootElement;
        foreach (var field in new[] { "converged", "iterations", "residual_norm", "temperature", "mu", "free_energy", "electrons_per_cell",
                                      "sites", "parameters", "sampling", "model_sha256", "tool_version", "backend" })
            Assert.True(root.TryGetProperty(field, out _), $"missing field {field}");
        // An absolute model path: the solution stays usable from any working directory.
        Assert.True(Path.IsPathRooted(root.GetProperty("model_path").GetString()));
        var site = root.GetProperty("sites")[0];
        foreach (var field in new[] { "name", "r", "lambda", "renormalized_level", "n_f", "z" })
            Assert.True(site.TryGetProperty(field, out _), $"missing site field {field}");
        double r = site.GetProperty("r").GetDouble();
        Assert.Equal(r * r, site.GetProperty("z").GetDouble(), 12);
        // n_f + r^2 = Q = 1: the slave-boson constraint (Coleman, PRB 29, 3035 (1984); Read & Newns, J. Phys. C 16, 3273 (1983))
        Assert.Equal(1.0, site.GetProperty("n_f").GetDouble() + r * r, 8);
    }

    [Fact]
    public void BadModelExitsTwoAndWritesNothing()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "broken.toml");
        File.WriteAllText(model, File.ReadAllText(Model).Replace("amplitude = \"V\"", "amplitude = \"Vx\""));
        var outFile = Path.Combine(dir, "solution.json");
        var (code, _, err) = CliRun.Run("solve", model, "--out", outFile);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("broken.toml:", err);
        Assert.Contains("did you mean 'V'", err);
        Assert.False(File.Exists(outFile));
    }

    [Theory]
    [InlineData("--temperature", "-3K", "temperature")]
    [InlineData("--mesh", "1", "mesh")]
    [InlineData("--set", "electrons=9", "parameter")]
    public void BadOptionsExitTwo(string option, string value, string expected)
    {
        var dir = CliRun.TempDir();
        var outFile = Path.Combine(dir, "solution.json");
        var (code, _, err) = CliRun.Run("solve", Model, option, value, "--out", outFile);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains(expected, err);
        Assert.False(File.Exists(outFile));
    }

    [Fact]
    public void NonConvergenceExitsThreeAndWritesNothing()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "capped.toml");
        File.WriteAllText(model, File.ReadAllText(Model).Replace("max_iterations = 200", "max_iterations = 1"));
        var outFile = Path.Combine(dir, "solution.json");
        var (code, stdout, err) = CliRun.Run("solve", model, "--mesh", "6", "--out", outFile);
        Assert.Equal(ExitCodes.NotConverged, code);
        Assert.Contains("NOT CONVERGED", stdout);
        Assert.Contains("was not written", err);
        Assert.False(File.Exists(outFile));
    }

    [Fact]
    public void SolutionOfAnotherModelTextIsRefused()
    {
        var dir = CliRun.TempDir();
        var model = Path.Combine(dir, "model.toml");
        File.Copy(Model, model);
        var solution = Path.Combine(dir, "solution.json");
        Assert.Equal(ExitCodes.Success, CliRun.Run("solve", model, "--mesh", "6", "--out", solution).Code);
        File.AppendAllText(model, "\n# edited after solving\n");
        var bands = Path.Combine(dir, "bands.csv");
        var (code, _, err) = CliRun.Run("bands", solution, "--out", bands);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("different model text", err);
        Assert.False(File.Exists(bands));
    }
}
