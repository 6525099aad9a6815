using System.Globalization;
using System.Text.Json;
using Meanfield.Cli;

namespace Meanfield.Tests.Cli;

/// <summary>End-to-end checks of `dos`, `nodes`, `curvature` and the phase fields of `solve` (small meshes).</summary>
public sealed class SpectraCommandTests
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    private static (string Header, string[] Columns, double[][] Rows) ReadCsv(string path)
    {
        // Our tables: '#' lines (title, key = value pairs, column units), the column names, the rows.
        var lines = File.ReadAllLines(path);
        var header = string.Join("\n", lines.TakeWhile(l => l.StartsWith('#')));
        var body = lines.SkipWhile(l => l.StartsWith('#')).ToArray();
        var cols = body[0].Split(',');
        var rows = body.Skip(1).Select(l => l.Split(',').Select(x => double.Parse(x, Inv)).ToArray()).ToArray();
        return (header, cols, rows);
    }

    [Fact]
    public void DosOfTheKondoInsulatorCountsAllBandsAndVanishesInTheGap()
    {
        using var cli = new CliHarness();
        var csv = cli.PathOf("dos.csv");
        Assert.Equal(ExitCodes.Success, cli.Run("dos", CliHarness.ShippedModel("kondo-insulator-sc.toml"), "--dos-mesh", "12", "--out", csv));
        Assert.True(File.Exists(cli.PathOf("dos.png")));
        var (header, cols, rows) = ReadCsv(csv);
        Assert.StartsWith("#", header);
        Assert.Contains("# energy_unit = meV", header);
        Assert.Contains("# column total_per_meV [1/meV]:", header);
        Assert.Contains($"# source = {CliHarness.ShippedModel("kondo-insulator-sc.toml")}", header);
        Assert.Contains("# parameters = ", header);
        Assert.Contains("# model_text = ", header);
        int integrated = Array.IndexOf(cols, "integrated"), total = Array.IndexOf(cols, "total_per_meV"), rel = Array.IndexOf(cols, "energy_minus_mu_meV");
        int c = Array.IndexOf(cols, "conduction_per_meV"), f = Array.IndexOf(cols, "correlated_per_meV");
        // Above the spectrum the integrated DOS counts every state: 2 orbitals x 2 spins = 4 per cell (common practice).
        Assert.Equal(4.0, rows[^1][integrated], 6);
        // Kind projections add up to the total (orthonormal basis, common practice).
        foreach (var r in rows) Assert.Equal(r[total], r[c] + r[f], 9);
        // Gapped spectrum: no states at mu, and the states below the gap hold exactly the 2 electrons per cell
        // (Luttinger count of an insulator, common practice).
        var inGap = rows.Where(r => Math.Abs(r[rel]) < 0.5).ToArray();
        Assert.NotEmpty(inGap);
        foreach (var r in inGap)
        {
            Assert.Equal(0.0, r[total], 12);
            Assert.Equal(2.0, r[integrated], 6);
        }
        Assert.Contains("DOS at mu: total 0,", cli.Out);
    }

    [Fact]
    public async Task DosParquetCarriesUnitsAndWarnsAboutAStepFinerThanTheMesh()
    {
        using var cli = new CliHarness();
        var pq = cli.PathOf("dos.parquet");
        Assert.Equal(ExitCodes.Success, cli.Run("dos", CliHarness.ShippedModel("kondo-insulator-sc.toml"), "--bare", "--dos-mesh", "4",
            "--window", "-700", "700", "--step", "0.5", "--out", pq));
        Assert.Contains("--dos-mesh", cli.Err);
        await using var stream = File.OpenRead(pq);
        await using var reader = await Parquet.ParquetReader.CreateAsync(stream);
        Assert.Equal("meV", reader.CustomMetadata["energy_unit"]);
        Assert.Equal("1/meV", reader.CustomMetadata["unit.total_per_meV"]);
        Assert.Equal(2801, reader.Metadata!.NumRows);
        using var rg = reader.OpenRowGroupReader(0);
        Assert.Equal("1/meV", rg.GetCustomMetadata(reader.Schema.DataFields.Single(x => x.Name == "total_per_meV"))["unit"]);
    }

    [Fact]
    public void DiamondModelAtZeroStaggeringHasDiracPointsAtX()
    {
        // Fu, Kane & Mele, PRL 98, 106803 (2007): with equal bonds (dt = 0) the diamond model has fourfold Dirac points
        // at the three X points.
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--search-mesh", "8", "--out", json));
        using var doc = JsonDocument.Parse(File.ReadAllText(json));
        var nodes = NodeReport.Members(doc);
        Assert.Equal(3, nodes.Count);
        foreach (var n in nodes)
        {
            Assert.Equal("X", n.GetProperty("location").GetString());
            Assert.Equal(4, n.GetProperty("bands_touching").GetInt32());
        }
        Assert.Equal("dirac-semimetal", doc.RootElement.GetProperty("phase").GetProperty("label").GetString());
    }

    [Fact]
    public void BrokenInversionGivesWeylNodesWithZeroNetChirality()
    {
        // Murakami, New J. Phys. 9, 356 (2007): between the topological and the trivial insulator (here t = 1,
        // lso = 0.125, dt = 0.3, m = 0.85, inside about 0.68 < m < 1.0) the gap closes at Weyl nodes; their chiralities
        // sum to zero (Nielsen & Ninomiya, Nucl. Phys. B 185, 20 (1981)).
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--set", "dt=0.3", "--set", "m=0.85", "--search-mesh", "10", "--out", json));
        using var doc = JsonDocument.Parse(File.ReadAllText(json));
        var nodes = NodeReport.Members(doc);
        Assert.NotEmpty(nodes);
        Assert.Equal(0, nodes.Count % 2);
        Assert.All(doc.RootElement.GetProperty("orbits").EnumerateArray(), o => Assert.Equal("weyl", o.GetProperty("kind").GetString()));
        foreach (var n in nodes)
        {
            Assert.Equal(1, Math.Abs(n.GetProperty("chirality").GetInt32()));
            Assert.Equal(n.GetProperty("chirality").GetInt32(), n.GetProperty("berry_flux_over_2pi").GetDouble(), 1);
        }
        Assert.Equal(0, nodes.Sum(n => n.GetProperty("chirality").GetInt32()));
        Assert.Equal(0, NodeReport.Totals(doc).GetProperty("chirality_sum").GetInt32());
        Assert.Equal("weyl-semimetal", doc.RootElement.GetProperty("phase").GetProperty("label").GetString());
        Assert.Contains("Weyl", cli.Out);
    }

    [Fact]
    public void LargeStaggeringGapsTheSpectrum()
    {
        // Murakami (2007): beyond the Weyl window the staggered potential gives a trivial insulator.
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--set", "dt=0.3", "--set", "m=1.5", "--search-mesh", "8", "--out", json));
        using var doc = JsonDocument.Parse(File.ReadAllText(json));
        Assert.Equal(0, NodeReport.Totals(doc).GetProperty("nodes").GetInt32());
        Assert.True(doc.RootElement.GetProperty("gaps").GetProperty("indirect").GetDouble() > 0.1);
        Assert.Equal(0.0, doc.RootElement.GetProperty("dos_at_mu").GetProperty("total").GetDouble(), 12);
    }

    [Fact]
    public void DashWritesTheResultToStandardOutputAndNothingElse()
    {
        // "-" as a file name means standard output (common practice of command-line tools); the messages go to
        // standard error so the data can be piped, and no picture or file is written.
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--set", "dt=0.3", "--set", "m=0.6", "--search-mesh", "8", "--out", "-"));
        using (var doc = JsonDocument.Parse(cli.Out))
            Assert.Equal("meanfield-nodes/2", doc.RootElement.GetProperty("format").GetString());
        Assert.Contains("standard output", cli.Err);
        Assert.Equal(ExitCodes.Success, cli.Run("dos", model, "--set", "dt=0.3", "--set", "m=1.5", "--dos-mesh", "6", "--window", "-0.5", "0.5", "--step", "0.05", "--out", "-"));
        var lines = cli.Out.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.StartsWith("#", lines[0]);
        Assert.Equal(21, lines.Count(l => !l.StartsWith('#')) - 1); // 21 energies after the header row
        Assert.Contains("DOS at mu", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Fact]
    public void DosWindowIsRelativeToMuAndReadsUnits()
    {
        // The same window written in the model's unit (eV) and in meV gives the same energies: 1 eV = 1000 meV
        // (SI brochure, 9th ed. (2019), prefixes); the window is E - mu, so the table spans mu - 0.5 eV .. mu + 0.5 eV.
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        string a = cli.PathOf("a.csv"), b = cli.PathOf("b.csv");
        Assert.Equal(ExitCodes.Success, cli.Run("dos", model, "--set", "dt=0.3", "--set", "m=1.5", "--dos-mesh", "6", "--window", "-0.5", "0.5", "--step", "0.01", "--out", a));
        Assert.Equal(ExitCodes.Success, cli.Run("dos", model, "--set", "dt=0.3", "--set", "m=1.5", "--dos-mesh", "6", "--window", "-500meV", "500meV", "--step", "10meV", "--out", b));
        var (headerA, colsA, rowsA) = ReadCsv(a);
        var (_, _, rowsB) = ReadCsv(b);
        Assert.Equal(rowsA.Length, rowsB.Length);
        Assert.Equal(101, rowsA.Length);
        int minus = Array.FindIndex(colsA, c => c.StartsWith("energy_minus_mu", StringComparison.Ordinal));
        Assert.True(minus >= 0, string.Join(",", colsA));
        Assert.Equal(-0.5, rowsA[0][minus], 9);
        Assert.Equal(0.5, rowsA[^1][minus], 9);
        for (int i = 0; i < rowsA.Length; i++) Assert.Equal(rowsA[i][minus], rowsB[i][minus], 9);
        Assert.Equal(ExitCodes.BadInput, cli.Run("dos", model, "--window", "1", "-1", "--out", cli.PathOf("c.csv")));
        Assert.False(File.Exists(cli.PathOf("c.csv")));
    }

    [Theory]
    [InlineData(11)]
    [InlineData(29)]
    [InlineData(47)]
    public void RandomSmallPerturbationsKeepTheChiralitySumAtZero(int seed)
    {
        // Nielsen & Ninomiya (1981): the chirality sum over the zone vanishes for any lattice Hamiltonian.
        var rng = new Random(seed);
        string Jitter(string name, double value) => string.Create(Inv, $"{name}={value + 0.04 * (rng.NextDouble() - 0.5):R}");
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--set", Jitter("dt", 0.3), "--set", Jitter("m", 0.85),
            "--set", Jitter("lso", 0.125), "--set", Jitter("t", 1), "--search-mesh", "10", "--out", json));
        using var doc = JsonDocument.Parse(File.ReadAllText(json));
        var chir = NodeReport.Members(doc).Select(n => n.GetProperty("chirality").GetInt32()).ToList();
        Assert.NotEmpty(chir);
        Assert.All(chir, c => Assert.NotEqual(0, c));
        Assert.Equal(0, chir.Sum());
    }

    [Fact]
    public void NodesOfAHeavyMetalHaveNoAnswerAndWriteNothing()
    {
        using var cli = new CliHarness();
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.NoAnswer, cli.Run("nodes", CliHarness.ShippedModel("heavy-metal-cubic.toml"), "--mesh", "8", "--out", json));
        Assert.Contains("fill a band partly", cli.Err);
        Assert.Empty(cli.Files());
    }

    [Fact]
    public void CurvatureOnADegeneratePlaneIsBadInputAndWritesNothing()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var csv = cli.PathOf("omega.csv");
        Assert.Equal(ExitCodes.BadInput, cli.Run("curvature", model, "--corner", "0,0,0", "--sides", "1,0,0", "2,0,0", "--out", csv));
        Assert.Contains("does not cut the zone", cli.Err);
        Assert.Equal(["fkm.toml"], cli.Files());
    }

    [Fact]
    public void CurvatureOnAFullZonePlaneOfATimeReversalInvariantModelHasChernNumberZero()
    {
        // Time reversal makes Omega(-k) = -Omega(k), so the Chern number of any full-zone plane vanishes
        // (Thouless, Kohmoto, Nightingale & den Nijs, PRL 49, 405 (1982); common practice).
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var csv = cli.PathOf("omega.csv");
        Assert.Equal(ExitCodes.Success, cli.Run("curvature", model, "--set", "dt=0.3", "--set", "m=0.85", "--corner", "0,0,0.1", "--sides", "1,0,0", "0,1,0",
            "--grid", "16", "--search-mesh", "8", "--out", csv));
        Assert.True(File.Exists(cli.PathOf("omega.png")));
        var (header, cols, rows) = ReadCsv(csv);
        Assert.Contains("# chern_number = 0", header);
        Assert.Contains("# column omega_angstrom2 [angstrom^2]:", header);
        Assert.Equal(16 * 16, rows.Length);
        int flux = Array.IndexOf(cols, "flux_rad");
        Assert.Equal(0.0, rows.Sum(r => r[flux]) / (2 * Math.PI), 6);
    }

    [Fact]
    public void SolveWritesThePhaseFields()
    {
        using var cli = new CliHarness();
        var json = cli.PathOf("solution.json");
        Assert.Equal(ExitCodes.Success, cli.Run("solve", CliHarness.ShippedModel("kondo-insulator-sc.toml"), "--mesh", "10", "--out", json));
        using var doc = JsonDocument.Parse(File.ReadAllText(json));
        var root = doc.RootElement.GetProperty("spectrum");
        // Two electrons fill the lower hybridized band of the periodic Anderson lattice: a Kondo insulator
        // (Hewson, The Kondo Problem to Heavy Fermions, 1993, ch. 7 (from memory)); without spin-orbit coupling the
        // bands are two spin copies, so every Z2 index vanishes (common practice).
        Assert.Equal("trivial-kondo-insulator", root.GetProperty("phase").GetString());
        Assert.Equal("(0;000)", root.GetProperty("z2").GetString());
        Assert.False(string.IsNullOrEmpty(root.GetProperty("phase_reason").GetString()));
        double direct = root.GetProperty("direct_gap").GetDouble(), indirect = root.GetProperty("indirect_gap").GetDouble();
        Assert.True(indirect > 0);
        Assert.True(direct >= indirect);
        Assert.Equal(0.0, root.GetProperty("dos_fermi_total").GetDouble(), 12);
        Assert.Equal(0.0, root.GetProperty("dos_fermi_correlated").GetDouble(), 12);
        Assert.Contains("phase        trivial-kondo-insulator", cli.Out);

        // The solution feeds `nodes`: an insulator has none, and the label agrees.
        var nodes = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", json, "--search-mesh", "8", "--out", nodes));
        using var n = JsonDocument.Parse(File.ReadAllText(nodes));
        Assert.Equal(0, n.RootElement.GetProperty("totals").GetProperty("nodes").GetInt32());
        Assert.Equal("trivial-kondo-insulator", n.RootElement.GetProperty("phase").GetProperty("label").GetString());
    }

    [Fact]
    public void SolveLabelsAPartlyFilledBandAHeavyMetal()
    {
        using var cli = new CliHarness();
        var json = cli.PathOf("solution.json");
        Assert.Equal(ExitCodes.Success, cli.Run("solve", CliHarness.ShippedModel("heavy-metal-cubic.toml"), "--mesh", "10", "--out", json));
        using var doc = JsonDocument.Parse(File.ReadAllText(json));
        var spectrum = doc.RootElement.GetProperty("spectrum");
        Assert.Equal("heavy-metal", spectrum.GetProperty("phase").GetString());
        Assert.True(spectrum.GetProperty("dos_fermi_total").GetDouble() > 0);
        Assert.False(spectrum.TryGetProperty("indirect_gap", out _));
    }
}
