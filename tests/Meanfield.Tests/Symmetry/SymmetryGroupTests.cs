using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Symmetry;
using Meanfield.Tests.Cli;
using Xunit.Abstractions;

namespace Meanfield.Tests.Symmetry;

/// <summary>
/// The symmetry found by testing H(Sk) = U H(k) U^dag against the point groups of handbook tables: m-3m has order 48,
/// -43m (zincblende) 24, 3m 6, 4/mmm 16, 6/mmm 24, -6m2 12 (International Tables for Crystallography, Vol. A (2016),
/// Table 3.2.3.2); time reversal doubles each group of a non-magnetic model (grey groups; Bradley &amp; Cracknell, The
/// Mathematical Theory of Symmetry in Solids (1972), ch. 7).
/// </summary>
public class SymmetryGroupTests(ITestOutputHelper output)
{
    internal static BoundModel Shipped(string file, IReadOnlyDictionary<string, string>? overrides = null) =>
        ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)), overrides);

    private SymmetryGroup Group(BoundModel model)
    {
        var g = SymmetryGroup.Find(new BlochHamiltonian(model));
        output.WriteLine($"{model.Name}: {g.Summary()}");
        output.WriteLine("  " + string.Join(" ", g.Operations.Select(o => o.Name)));
        foreach (var c in g.Checks.Where(c => !c.Kept).Take(6)) output.WriteLine($"  rejected {c.Name}: {c.Reason}");
        return g;
    }

    [Theory]
    [InlineData("kondo-insulator-sc.toml", 48, 96)]   // m-3m, grey
    [InlineData("heavy-metal-cubic.toml", 48, 96)]    // m-3m, grey
    [InlineData("weyl-diamond.toml", 6, 12)]          // 3m: zincblende -43m lowered by the [111] bond distortion
    [InlineData("honeycomb-2d.toml", 12, 24)]         // -6m2: the site group of honeycomb, keeps both sublattices
    public void ShippedModels(string file, int unitary, int order)
    {
        var g = Group(Shipped(file));
        Assert.Equal(unitary, g.UnitaryCount);
        Assert.Equal(order, g.Order);
    }

    /// <summary>Adds B.sigma along [111] to every orbital (a Zeeman term; its splitting is 2|B|).</summary>
    internal static BoundModel WithZeeman111(BoundModel model, double b)
    {
        var onsite = model.Onsite.ToList();
        for (int o = 0; o < model.Orbitals.Count; o++)
            onsite.Add(new OnsiteTerm(o, FlavourMatrix.Pauli(0, b, b, b), "zeeman[111]"));
        return model.With(onsite: onsite);
    }

    /// <summary>
    /// A field along [111] on the 3m diamond model keeps the threefold rotations, turns the mirrors into mirrors times
    /// time reversal (B is axial: a mirror containing it reverses it) and breaks time reversal itself: the magnetic
    /// group 3m' of order 6 (Bradley &amp; Cracknell 1972, ch. 7; common practice).
    /// </summary>
    [Fact]
    public void ZeemanFieldBreaksTheOperationsThatReverseIt()
    {
        var g = Group(WithZeeman111(Shipped("weyl-diamond.toml"), 20));
        Assert.Equal(6, g.Order);
        Assert.Equal(3, g.UnitaryCount);
        Assert.Contains(g.Operations, o => o.Name == "m'[1-10]");
        Assert.DoesNotContain(g.Operations, o => o.Name == "m[1-10]" || o.Name == "1'");
    }

    /// <summary>A bond along x only lowers m-3m to 4/mmm (order 16; International Tables Vol. A (2016), Table 3.2.3.2).</summary>
    [Fact]
    public void AnAsymmetricTermLowersTheGroup()
    {
        var model = Shipped("kondo-insulator-sc.toml");
        var extra = model.Hoppings.ToList();
        int d = model.Orbitals.ToList().FindIndex(o => o.Kind == OrbitalKind.Conduction);
        extra.Add(new Hopping(d, d, (2, 0, 0), FlavourMatrix.Identity(2, -7), "x only"));
        var g = Group(model.With(hoppings: extra));
        Assert.Equal(16, g.UnitaryCount);
        Assert.Equal(32, g.Order);
        Assert.Contains(g.Operations, o => o.Name == "4[100]");
        Assert.DoesNotContain(g.Operations, o => o.Name == "4[001]");
    }

    [Fact]
    public void ARequestedOperationTheModelBreaksIsRefused()
    {
        var model = Shipped("kondo-insulator-sc.toml");
        var extra = model.Hoppings.ToList();
        int d = model.Orbitals.ToList().FindIndex(o => o.Kind == OrbitalKind.Conduction);
        extra.Add(new Hopping(d, d, (2, 0, 0), FlavourMatrix.Identity(2, -7), "x only"));
        var bare = new BlochHamiltonian(model.With(hoppings: extra));
        var e = Assert.Throws<ArgumentException>(() => SymmetryGroup.Find(bare, SymmetryRequest.Parse("4[100],4[001]")));
        output.WriteLine(e.Message);
        Assert.Contains("4[001]", e.Message);
        Assert.Contains("differs by", e.Message);
        var swap = Assert.Throws<ArgumentException>(() => SymmetryGroup.Find(new BlochHamiltonian(Shipped("weyl-diamond.toml")), SymmetryRequest.Parse("-1")));
        output.WriteLine(swap.Message);
        Assert.Contains("-1", swap.Message);
        Assert.Throws<ArgumentException>(() => SymmetryGroup.Find(bare, SymmetryRequest.Parse("7[001]")));
        // What the model keeps is accepted, and generates its group: 4[100] alone generates the cyclic group of order 4.
        Assert.Equal(4, SymmetryGroup.Find(bare, SymmetryRequest.Parse("4[100]")).Order);
    }

    public static TheoryData<string, int, bool, double> ReducedCases() => new()
    {
        { "kondo-insulator-sc.toml", 8, true, 0 }, { "kondo-insulator-sc.toml", 7, false, 0 },
        { "heavy-metal-cubic.toml", 8, true, 0 }, { "heavy-metal-cubic.toml", 6, false, 0 },
        { "weyl-diamond.toml", 8, true, 0 }, { "weyl-diamond.toml", 6, false, 0 },
        { "weyl-diamond.toml", 8, true, 20 }, { "weyl-diamond.toml", 6, false, 20 },
        { "honeycomb-2d.toml", 12, false, 0 }, { "honeycomb-2d.toml", 12, true, 0 },
    };

    /// <summary>
    /// Zone sums over the irreducible wedge with orbit weights equal those over the full mesh (the orbit of a k-point has
    /// equal energies, f weights and dE/dr for every operation kept), at amplitudes off the saddle point; also with a
    /// Zeeman field that breaks half the operations. Tolerance 1e-12 relative: summation order only.
    /// </summary>
    [Theory]
    [MemberData(nameof(ReducedCases))]
    public void ReducedSumsEqualFullSums(string file, int mesh, bool shifted, double zeeman)
    {
        var model = Shipped(file);
        if (zeeman != 0) model = WithZeeman111(model, zeeman);
        var bare = new BlochHamiltonian(model);
        var group = SymmetryGroup.Find(bare);
        var kmesh = new KMesh(model.Lattice, mesh, shifted);
        var reduced = new MeshStateSum(bare, kmesh, group, keepVectors: false);
        var full = new MeshStateSum(bare, kmesh);
        output.WriteLine($"{file} mesh {mesh} shifted {shifted}: {reduced.Description}");
        int groups = bare.GroupCount;
        var amp = new MeanFieldAmplitudes(Enumerable.Range(0, groups).Select(g => 0.3 + 0.1 * g).ToArray(),
                                          Enumerable.Range(0, groups).Select(g => -model.Shells[0].Level * (0.9 + 0.05 * g)).ToArray());
        double t = model.Solver?.Temperature ?? 1;
        double electrons = model.ElectronsPerCell;
        var tr = reduced.Fill(amp); var tf = full.Fill(amp);
        double scale = SymmetryFinder.LargestAmplitude(model);
        Assert.True(reduced.Irreducible.Count < kmesh.Count);
        Assert.Equal(kmesh.Count, reduced.Irreducible.Multiplicity.ToArray().Sum());
        // At one mu (the full mesh's): N, Omega, n_f and dOmega/dr.
        double mu = BandFilling.Compute(tf, electrons, t).Mu;
        var a = Sums(tr, mu, t); var b = Sums(tf, mu, t);
        for (int i = 0; i < a.Length; i++) Near(a[i], b[i], i == 0 || (i >= 2 && i < 2 + groups) ? 1 : scale, i switch
        {
            0 => "N", 1 => "Omega", _ when i < 2 + groups => $"n_f[{i - 2}]", _ => $"dOmega/dr[{i - 2 - groups}]",
        });
        // The reduced table's own mu solves the full problem (inside a gap mu is fixed only as far as N resolves it).
        double muReduced = BandFilling.Compute(tr, electrons, t).Mu;
        Near(Sums(tf, muReduced, t)[0], electrons, 1, "N_full(mu_reduced)");

        void Near(double x, double y, double s, string what)
        {
            output.WriteLine($"  {what}: {x:R} vs {y:R}");
            Assert.True(Math.Abs(x - y) <= 1e-12 * Math.Max(s, Math.Abs(y)), $"{what}: {x:R} vs {y:R}");
        }
    }

    /// <summary>
    /// The group of one scan point carried over to the next (<see cref="SymmetryGroup.CarriedOver"/>): the shipped Weyl
    /// model's [111] bond distortion dt lowers zincblende -43m to 3m, so dt = 0 gains operations (grey groups of order 48
    /// and 12; International Tables Vol. A (2016), Table 3.2.3.2). (Its staggered potential m does not change the group:
    /// the inversion it breaks swaps the two untied shell groups, which is never used.) The dt != 0 group still holds at
    /// dt = 0 and is kept there (a subgroup); the dt = 0 group does not hold at dt != 0 and is refused. Zone sums over the carried-over subgroup's wedge equal those over the full mesh (the plain average), and
    /// a scan-style solve with <see cref="SolveReuse"/> equals a fresh one.
    /// </summary>
    [Fact]
    public void ACarriedOverGroupIsASubgroupThatKeepsTheSums()
    {
        var broken = Shipped("weyl-diamond.toml");
        var kept = Shipped("weyl-diamond.toml", new Dictionary<string, string> { ["dt"] = "0" });
        var bareBroken = new BlochHamiltonian(broken); var bareKept = new BlochHamiltonian(kept);
        var g1 = SymmetryGroup.Find(bareBroken); var g0 = SymmetryGroup.Find(bareKept);
        Assert.Equal(12, g1.Order);
        Assert.Equal(48, g0.Order);
        var carried = g1.CarriedOver(bareKept);
        Assert.NotNull(carried);
        Assert.Equal(g1.Operations.Select(o => o.Name), carried!.Operations.Select(o => o.Name));
        Assert.All(carried.Checks, c => Assert.True(c.Kept && c.Defect <= SymmetryFinder.RelativeTolerance, c.Name));
        Assert.Null(g0.CarriedOver(bareBroken));                                           // -4 and the other -43m operations fail at dt != 0
        Assert.Null(g1.CarriedOver(new BlochHamiltonian(Shipped("kondo-insulator-sc.toml")))); // another structure

        var kmesh = new KMesh(kept.Lattice, 6, true);
        var reduced = new MeshStateSum(bareKept, kmesh, carried, keepVectors: false);
        var full = new MeshStateSum(bareKept, kmesh);
        var amp = new MeanFieldAmplitudes([0.4, 0.4], [900, 900]);
        double t = 0.3, mu = BandFilling.Compute(full.Fill(amp), kept.ElectronsPerCell, t).Mu;
        var a = Sums(reduced.Fill(amp), mu, t); var b = Sums(full.Fill(amp), mu, t);
        double scale = SymmetryFinder.LargestAmplitude(kept);
        for (int i = 0; i < a.Length; i++) Assert.True(Math.Abs(a[i] - b[i]) <= 1e-12 * Math.Max(scale, Math.Abs(b[i])), $"sum {i}: {a[i]:R} vs {b[i]:R}");

        // A scan-style pair of solves (dt = 0.2 t, then dt = 0 through the same reuse) against a fresh solve.
        var settings = new SolverSettings { Temperature = 0.3, Mesh = 8, Tolerance = 1e-11 };
        var reuse = new SolveReuse();
        var first = new SaddlePointSolver(broken, settings, reuse).Solve();
        var second = new SaddlePointSolver(kept, settings with { InitialGuess = first.Amplitudes }, reuse).Solve();
        var fresh = new SaddlePointSolver(kept, settings with { InitialGuess = first.Amplitudes }).Solve();
        Assert.Equal(1, reuse.GroupsCarriedOver);
        Assert.True(second.Converged && fresh.Converged);
        Assert.Equal(12, second.Symmetry!.Operations); Assert.Equal(48, fresh.Symmetry!.Operations);
        output.WriteLine($"r {second.Groups[0].R:R} vs {fresh.Groups[0].R:R}, mu {second.Mu:R} vs {fresh.Mu:R}");
        for (int g = 0; g < 2; g++)
        {
            Assert.Equal(fresh.Groups[g].R, second.Groups[g].R, 1e-9);
            Assert.Equal(fresh.Groups[g].Lambda, second.Groups[g].Lambda, 1e-9 * scale);
        }
        Assert.Equal(fresh.Mu, second.Mu, 1e-9 * scale);
        Assert.Equal(fresh.FreeEnergy, second.FreeEnergy, 1e-9 * scale);
    }

    /// <summary>(N, Omega, n_f,g..., dOmega/dr_g...) of a table at fixed mu.</summary>
    private static double[] Sums(StateTable table, double mu, double t)
    {
        int g = table.Groups;
        var r = new double[2 + 2 * g];
        for (int s = 0; s < table.Count; s++)
        {
            double x = table.Energy[s] - mu, f = Meanfield.Numerics.FermiDirac.Occupation(x, t), w = table.Weight[s];
            r[0] += w * f; r[1] += w * Meanfield.Numerics.FermiDirac.GrandPotential(x, t);
            for (int q = 0; q < g; q++) { r[2 + q] += w * f * table.FWeight[s * g + q]; r[2 + g + q] += w * f * table.EnergySlope[s * g + q]; }
        }
        return r;
    }

    /// <summary>Every full-mesh point is located on its wedge point by an operation that keeps its spectrum.</summary>
    [Fact]
    public void LocateMapsEveryPointToASpectrumEquivalentRepresentative()
    {
        var model = Shipped("weyl-diamond.toml");
        var bare = new BlochHamiltonian(model);
        var mesh = new KMesh(model.Lattice, 6, shifted: false);
        var wedge = new IrreducibleMesh(mesh, SymmetryGroup.Find(bare));
        var counts = new int[wedge.Count];
        int n = bare.Size;
        var h = new System.Numerics.Complex[n * n]; var s = new System.Numerics.Complex[n * n];
        var e1 = new double[n]; var e2 = new double[n];
        var eig = Meanfield.Numerics.Eigensolvers.Create(n);
        for (int i = 0; i < mesh.Count; i++)
        {
            var (w, op) = wedge.Locate(i);
            Assert.True(w >= 0);
            counts[w]++;
            bare.Assemble(mesh.Cartesian(i), h, s); eig.Solve(h, e1, Span<System.Numerics.Complex>.Empty);
            bare.Assemble(mesh.Cartesian(wedge.Representatives[w]), h, s); eig.Solve(h, e2, Span<System.Numerics.Complex>.Empty);
            for (int b = 0; b < n; b++) Assert.Equal(e1[b], e2[b], 1e-9);
            Assert.NotNull(op);
        }
        Assert.Equal(wedge.Multiplicity.ToArray(), counts);
    }
}
