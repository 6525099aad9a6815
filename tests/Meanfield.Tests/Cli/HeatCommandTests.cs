using System.CommandLine;
using Meanfield.Cli;
using Meanfield.Cli.Commands;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.Cli;

public class HeatCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("heatcli").FullName;
    private static string Model(string name) => Path.Combine(ModelText.RepositoryRoot(), "models", name);

    public void Dispose() => Directory.Delete(_dir, true);

    private static (int Code, string Out, string Err) Run(params string[] args)
    {
        var o = new StringWriter(); var e = new StringWriter();
        int code = Runner.Run(new RootCommand { HeatCommand.Build() }, ["heat", .. args], o, e);
        return (code, o.ToString(), e.ToString());
    }

    [Fact]
    public void BadMeasuredFileExitsTwoNamingTheLineAndWritesNothing()
    {
        var csv = Path.Combine(_dir, "bad.csv");
        File.WriteAllText(csv, "# comment\nT_K,C_J_per_mol_K\n1,0.1\n2,abc\n3,0.3\n");
        var outFile = Path.Combine(_dir, "heat.csv");
        var (code, _, err) = Run(Model("heavy-metal-cubic.toml"), "--tmin", "1K", "--tmax", "5K", "--measured", csv, "--out", outFile);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("bad.csv:4:", err);
        Assert.Equal([csv], Directory.GetFiles(_dir));
    }

    [Fact]
    public void FitWindowWithTooFewPointsExitsTwoSayingHowManyAreNeeded()
    {
        var outFile = Path.Combine(_dir, "heat.csv");
        var (code, _, err) = Run(Model("heavy-metal-cubic.toml"), "--tmin", "1K", "--tmax", "5K", "--temperature-points", "5",
                                 "--dos-mesh", "8", "--fit-window", "1K", "1.01K", "--out", outFile);
        Assert.Equal(ExitCodes.BadInput, code);
        Assert.Contains("at least 3 points", err);
        Assert.Contains("holds 1", err); // only T = 1 K of the table and of the fits' logarithmic grid
        Assert.Empty(Directory.GetFiles(_dir));
    }

    // Far below T_K^MF the boson amplitudes change only at order T^2, so C = -T d^2F/dT^2 of the re-solved mean field
    // and the quasiparticle C of the frozen bands agree to leading order in T / T_K (Read & Newns, J. Phys. C 16, 3273
    // (1983); common practice). Here the solve mesh (8) and the DOS mesh (12) differ, hence the loose 15 %.
    [Fact]
    public void FullMeanFieldSweepAddsItsColumnAndAgreesWithTheQuasiparticleHeatFarBelowTheKondoScale()
    {
        var outFile = Path.Combine(_dir, "full.csv");
        var (code, stdout, err) = Run(Model("heavy-metal-cubic.toml"), "--mesh", "8", "--dos-mesh", "12", "--tmin", "1K", "--tmax", "10K",
                                      "--temperature-points", "10", "--full-mean-field", "--mf-points", "9", "--out", outFile);
        Assert.True(code == 0, err);
        Assert.Contains("full mean field:", stdout);
        var lines = File.ReadAllLines(outFile).Where(l => !l.StartsWith('#')).ToArray();
        var cols = lines[0].Split(',');
        int c = Array.IndexOf(cols, "C_J_per_mol_K"), full = Array.IndexOf(cols, "C_full_J_per_mol_K");
        Assert.True(full > 0, lines[0]);
        var at5 = lines.Skip(1).Select(l => l.Split(',')).Single(r => r[0] == "5");
        double cq = double.Parse(at5[c], System.Globalization.CultureInfo.InvariantCulture), cf = double.Parse(at5[full], System.Globalization.CultureInfo.InvariantCulture);
        Assert.InRange(cf / cq, 0.85, 1.15);
    }

    [Fact]
    public void WritesTableResidualsAndPictures()
    {
        var outFile = Path.Combine(_dir, "heat.csv");
        var (code, stdout, err) = Run(Model("heavy-metal-cubic.toml"), "--tmin", "0.5K", "--tmax", "10K", "--temperature-points", "12", "--log",
                                      "--dos-mesh", "12", "--measured", Path.Combine(ModelText.RepositoryRoot(), "models", "measured", "demo-heavy-metal-heat.csv"),
                                      "--debye", "250K", "--atoms", "4", "--out", outFile);
        Assert.True(code == 0, err);
        Assert.Contains("gamma =", stdout);
        var lines = File.ReadAllLines(outFile);
        Assert.StartsWith("#", lines[0]);
        var header = lines.First(l => !l.StartsWith('#'));
        Assert.Equal("T_K,C_J_per_mol_K,C_over_T_mJ_per_mol_K2,S_J_per_mol_K,node_C_J_per_mol_K,mu_minus_mu0_meV", header);
        Assert.Equal(12, lines.Count(l => !l.StartsWith('#')) - 1);
        foreach (var f in new[] { "heat.residuals.csv", "heat.png", "heat.loglog.png" })
            Assert.True(File.Exists(Path.Combine(_dir, f)), f);
    }
}
