using System.Numerics;
using Meanfield.Analysis;
using Meanfield.Analysis.Nodes;
using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Solutions;
using Meanfield.Solver;
using Meanfield.Tests.Cli;
using Meanfield.Cli;
using Meanfield.Units;

namespace Meanfield.Tests.Analysis.Nodes;

/// <summary>
/// Nodes of the renormalized heavy bands, whose width next to the Fermi level is a small fraction of the bandwidth:
/// the shipped diamond Kondo lattice at dt = 0 (its heavy bands inherit the X-W line nodes of the Fu-Kane-Mele
/// conduction bands: Fu, Kane &amp; Mele, PRL 98, 106803 (2007)).
/// </summary>
public class HeavyBandNodeTests
{
    private static string ShippedWeylText() => File.ReadAllText(CliHarness.ShippedModel("weyl-diamond.toml"));

    private static (Solution Solution, SpectrumDigest Digest) Solve(string text, IReadOnlyDictionary<string, string> overrides, double temperature, int mesh)
    {
        var model = ModelBinder.Bind(ModelFile.Parse(text, CliHarness.ShippedModel("weyl-diamond.toml")), overrides);
        var settings = new SolverSettings { Temperature = temperature, Mesh = mesh, Shifted = true };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        var solution = Solution.FromSaddlePoint(model, sp, settings);
        return (solution, SpectrumSummary.Compute(solution));
    }

    private static WeylNode Nearest(IEnumerable<WeylNode> pool, WeylNode n) => pool.MinBy(p => (p.Reduced - n.Reduced).Norm)!;

    private static readonly Dictionary<string, string> Symmetric = new() { ["dt"] = "0", ["m"] = "60" };

    [Fact]
    public void TwelveNodesOfOppositeChiralityPinnedAtMuAtZeroTemperature()
    {
        var (solution, digest) = Solve(ShippedWeylText(), Symmetric, 0, 27);
        var nodes = digest.Nodes!;
        // Nielsen & Ninomiya, Nucl. Phys. B 185, 20 (1981): chiralities over the zone sum to zero; with dt = 0 the
        // touchings lie on the twelve X-W segments, one each (derived for the bare model in FuKaneMeleWindowTests).
        Assert.Equal(12, nodes.Nodes.Count);
        Assert.Equal(6, nodes.Nodes.Count(n => n.Chirality == 1));
        Assert.Equal(6, nodes.Nodes.Count(n => n.Chirality == -1));
        Assert.Equal(0, nodes.ChiralitySum);
        Assert.All(nodes.Nodes, n => Assert.Equal("on X-W", n.Location));
        // The T -> 0 mu of an ideal semimetal is its node energy (electron count; common practice): far inside
        // 1e-6 of the heavy-band width, whatever the mesh.
        Assert.Equal(ChemicalPotentialRule.NodeEnergy, solution.MuRule);
        Assert.All(nodes.Nodes, n => Assert.True(Math.Abs(n.EnergyOffset) < 1e-6 * nodes.Tolerances.PairWidth, $"{n.EnergyOffset}"));
        Assert.Equal(Phase.WeylSemimetal, digest.Phase!.Phase);
    }

    [Fact]
    public void AZeroTemperatureSolutionFileWithMuAtTheNodesLoadsAndGivesTheSameNodes()
    {
        // The solution file carries mu at the node energy (inside the window of no states): loading it must accept
        // that mu as a saddle point and `nodes` must report the nodes pinned there (electron count; common practice).
        using var cli = new CliHarness();
        var json = cli.PathOf("s.json");
        Assert.Equal(ExitCodes.Success, cli.Run("solve", CliHarness.ShippedModel("weyl-diamond.toml"), "--set", "dt=0", "--set", "m=60",
            "-T", "0", "--mesh", "15", "--out", json));
        var nodes = cli.PathOf("n.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", json, "--out", nodes));
        using var doc = System.Text.Json.JsonDocument.Parse(File.ReadAllText(nodes));
        Assert.Equal("node-energy", doc.RootElement.GetProperty("mu_rule").GetString());
        Assert.Equal(12, NodeReport.Totals(doc).GetProperty("pinned_at_mu").GetInt32());
        Assert.Equal("weyl-semimetal", doc.RootElement.GetProperty("phase").GetProperty("label").GetString());
    }

    [Fact]
    public void AtTwoKelvinTheSameNodesComeBackWithTheirOffsetFromMu()
    {
        var (_, cold) = Solve(ShippedWeylText(), Symmetric, 0, 27);
        double kelvin = 1 / Units.EnergyUnits.Kelvins(EnergyUnit.MilliElectronVolt);
        var (warm, digest) = Solve(ShippedWeylText(), Symmetric, 2 * kelvin, 27);
        var nodes = digest.Nodes!;
        Assert.Equal(12, nodes.Nodes.Count);
        Assert.Equal(0, nodes.ChiralitySum);
        // The thermal shift of mu is a small fraction of k_B T (Sommerfeld expansion of N(mu) about the node: common
        // practice); it is reported, not refused.
        double offset = nodes.Nodes[0].EnergyOffset;
        Assert.All(nodes.Nodes, n => Assert.Equal(offset, n.EnergyOffset, 9));
        Assert.NotEqual(0, offset);
        Assert.True(Math.Abs(offset) < 2 * kelvin, $"{offset}");
        Assert.Equal(warm.Mu + offset, nodes.Nodes[0].Energy, 9);
        // The nodes move only with the (slightly changed) saddle point.
        foreach (var n in nodes.Nodes)
        {
            var twin = Nearest(cold.Nodes!.Nodes, n);
            Assert.True((twin.Reduced - n.Reduced).Norm < 1e-3, $"{twin.Reduced} {n.Reduced}");
            Assert.Equal(twin.Chirality, n.Chirality);
        }
    }

    [Fact]
    public void EnergiesTimesAThousandAndALatticeFiveTimesLargerGiveTheSameReducedAnswers()
    {
        // Common practice: scaling every energy by s and every length by l maps the saddle point onto itself (r, reduced
        // positions, chiralities and offsets in units of the energy scale unchanged): a check that no tolerance is tied
        // to an absolute energy or length.
        var text = ShippedWeylText();
        var scaled = text.Replace("constant = 5.6", "constant = 28");
        Assert.NotEqual(text, scaled);
        var s = new Dictionary<string, string> { ["t"] = "250000", ["V"] = "250000", ["ef"] = "-1000000", ["dt"] = "0", ["m"] = "60000" };
        var (a, da) = Solve(text, Symmetric, 0, 17);
        var (b, db) = Solve(scaled, s, 0, 17);
        for (int g = 0; g < a.Amplitudes!.GroupCount; g++) Assert.Equal(a.Amplitudes.R[g], b.Amplitudes!.R[g], 8);
        var na = da.Nodes!.Nodes; var nb = db.Nodes!.Nodes;
        Assert.Equal(na.Count, nb.Count);
        Assert.Equal(12, na.Count);
        Assert.Equal(da.Phase!.Phase, db.Phase!.Phase);
        foreach (var n in na)
        {
            var twin = Nearest(nb, n);
            Assert.True((twin.Reduced - n.Reduced).Norm < 1e-7, $"{n.Reduced} {twin.Reduced}");
            Assert.Equal(n.Chirality, twin.Chirality);
            Assert.Equal(n.EnergyOffset / 250, twin.EnergyOffset / 250000, 9);
        }
        Assert.Equal(da.Nodes.Tolerances.PairWidth * 1000, db.Nodes.Tolerances.PairWidth, 6 - 3);
    }
}

/// <summary>
/// The Weyl window of the Fu-Kane-Mele model with a staggered potential at equal bonds (dt = 0), derived on the X-W line.
/// </summary>
/// <remarks>
/// Derivation (Fu, Kane &amp; Mele, PRL 98, 106803 (2007) for the model; Murakami, New J. Phys. 9, 356 (2007) for Weyl
/// nodes between the phases). H(k) = d1 tau_x + d2 tau_y + tau_z (m + D.s): the spin-orbit term is odd between the
/// sublattices and the staggered potential is m tau_z, so in the eigenbasis of D.s (fixed at each k) the bands are
/// E = +-sqrt(d1^2 + d2^2 + (m +- |D|)^2). With dt = 0, d1 + i d2 = t (1 + sum_j e^{ik.a_j}) vanishes on the X-W lines,
/// so there the gap closes where |D(k)| = |m|. On k = (2 pi/a)(1, u, 0) the twelve next-nearest-neighbour terms
/// i (8 lambda/a^2) s.(d1 x d2) e^{ik.e}, summed below, give D = (0, 8 lambda sin(pi u), 0): one node per X-W segment at
/// sin(pi u) = |m| / (8 lambda), for 0 &lt; |m| &lt; 8 lambda; no node on the lines outside that window.
/// </remarks>
public class FuKaneMeleWindowTests
{
    private const double Lambda = 0.125;

    [Fact]
    public void TheSpinOrbitVectorOnTheXWLineIsEightLambdaSinPiU()
    {
        // The sum written out independently of the model code, over the 12 two-step paths A -> B -> A.
        Vec3[] bonds = [new(1, 1, 1), new(1, -1, -1), new(-1, 1, -1), new(-1, -1, 1)];
        foreach (double u in new[] { 0.1, 0.25, 0.4 })
        {
            var k = 2 * Math.PI * new Vec3(1, u, 0);   // a = 1
            Complex dx = 0, dy = 0, dz = 0;
            foreach (var d1 in bonds)
                foreach (var d2n in bonds)
                {
                    if (d1 == d2n) continue;
                    Vec3 b1 = d1 / 4, b2 = -1 * (d2n / 4), e = b1 + b2, c = 8 * b1.Cross(b2);
                    var ph = Complex.ImaginaryOne * Complex.Exp(Complex.ImaginaryOne * k.Dot(e));
                    dx += ph * c.X; dy += ph * c.Y; dz += ph * c.Z;
                }
            Assert.Equal(0, dx.Magnitude, 12);
            Assert.Equal(0, dz.Magnitude, 12);
            Assert.Equal(8 * Math.Sin(Math.PI * u), dy.Real, 12);
        }
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(0.6)]
    [InlineData(0.9)]
    public void InsideTheWindowTwelveNodesSitOnTheXWLinesWherePredicted(double m)
    {
        double u = Math.Asin(m / (8 * Lambda)) / Math.PI;
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--set", $"m={m}", "--search-mesh", "12", "--out", json));
        using var doc = System.Text.Json.JsonDocument.Parse(File.ReadAllText(json));
        var members = NodeReport.Members(doc);
        Assert.Equal(12, members.Count);
        foreach (var n in members)
        {
            var c = n.GetProperty("cartesian").EnumerateArray().Select(x => Math.Abs(x.GetDouble()) / (2 * Math.PI)).OrderBy(x => x).ToArray();
            Assert.Equal(0, c[0], 7);
            Assert.Equal(u, c[1], 7);
            Assert.Equal(1, c[2], 7);
            Assert.Equal(1, Math.Abs(n.GetProperty("chirality").GetInt32()));
        }
        Assert.Equal(0, NodeReport.Totals(doc).GetProperty("chirality_sum").GetInt32());
        Assert.Equal("weyl-semimetal", doc.RootElement.GetProperty("phase").GetProperty("label").GetString());
    }

    [Fact]
    public void BeyondTheWindowTheLinesAreGapped()
    {
        using var cli = new CliHarness();
        var model = cli.Write("fkm.toml", CliHarness.FuKaneMeleToml);
        var json = cli.PathOf("nodes.json");
        Assert.Equal(ExitCodes.Success, cli.Run("nodes", model, "--set", "m=1.2", "--search-mesh", "12", "--out", json));
        using var doc = System.Text.Json.JsonDocument.Parse(File.ReadAllText(json));
        Assert.Equal(0, NodeReport.Totals(doc).GetProperty("nodes").GetInt32());
        // The smallest gap on the X-W lines is 2 (|m| - 8 lambda) at W.
        Assert.True(doc.RootElement.GetProperty("gaps").GetProperty("indirect").GetDouble() > 0);
        // Beyond the window the inversion-breaking potential wins: a normal (trivial) insulator, the Weyl phase lying
        // between the topological and the normal one (Murakami, New J. Phys. 9, 356 (2007)).
        Assert.Equal("trivial-kondo-insulator", doc.RootElement.GetProperty("phase").GetProperty("label").GetString());
    }
}
