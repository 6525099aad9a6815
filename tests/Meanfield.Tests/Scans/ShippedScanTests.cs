using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

// The shipped scan files must parse and stay demo-sized (README: 12 x 12 points, mesh 10-12). The model files they name
// are written elsewhere, so this test gives them stand-ins.
public sealed class ShippedScanTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("mf-shipped-").FullName;
    public void Dispose() => Directory.Delete(_dir, true);

    private static string ScansFolder()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
            if (File.Exists(Path.Combine(d.FullName, "scans", "weyl-diamond-v-ratio.toml"))) return Path.Combine(d.FullName, "scans");
        throw new DirectoryNotFoundException("scans/ folder not found above the test binaries");
    }

    [Theory]
    [InlineData("weyl-diamond-v-ratio.toml", "weyl-diamond.toml")]
    [InlineData("cubic-kondo-t-v.toml", "kondo-insulator-sc.toml")]
    public void Shipped_scan_parses_into_a_demo_sized_grid(string scan, string model)
    {
        Directory.CreateDirectory(Path.Combine(_dir, "scans"));
        Directory.CreateDirectory(Path.Combine(_dir, "models"));
        File.WriteAllText(Path.Combine(_dir, "models", model), "# stand-in\n");
        string copy = Path.Combine(_dir, "scans", scan);
        File.Copy(Path.Combine(ScansFolder(), scan), copy);
        var d = ScanFileReader.Load(copy);
        Assert.InRange(d.ToGrid().Count, 16, 400); // demo-sized: seconds to a minute on 2 cores
        Assert.InRange(d.Solver.Mesh, 8, 12);
        var p = d.ToGrid().Point(0);
        Assert.False(double.IsNaN(p.TemperatureK));
    }
}
