using Meanfield.Output;

namespace Meanfield.Tests.Cli;

/// <summary>The program speaks of itself by one name and one version string, in help, `--version` and its files.</summary>
public sealed class ProgramIdentityTests
{
    [Fact]
    public void HelpNamesTheCommandMeanfield()
    {
        var (code, stdout, _) = CliRun.Run("solve", "--help");
        Assert.Equal(0, code);
        Assert.Contains("  meanfield solve <MODEL>", stdout);
        Assert.DoesNotContain("Meanfield.Cli", stdout);
        Assert.DoesNotContain("testhost", stdout);
    }

    [Fact]
    public void VersionIsTheOneFilesCarry()
    {
        var (code, stdout, _) = CliRun.Run("--version");
        Assert.Equal(0, code);
        Assert.Equal(Provenance.ToolVersion, stdout.Trim());
        var dir = CliRun.TempDir();
        var json = Path.Combine(dir, "s.json");
        Assert.Equal(0, CliRun.Run("solve", CliRun.ModelPath("kondo-insulator-sc.toml"), "--mesh", "6", "--out", json).Code);
        using var doc = System.Text.Json.JsonDocument.Parse(File.ReadAllText(json));
        Assert.Equal(stdout.Trim(), doc.RootElement.GetProperty("tool_version").GetString());
        Assert.Equal(stdout.Trim(), Meanfield.Scans.ScanMetadata.Version);
    }
}
