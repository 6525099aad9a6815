using System.Numerics;
using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Units;

namespace Meanfield.Tests.Models;

/// <summary>Binding: overrides, defaults, generated terms and the summary, checked against hand-derived values.</summary>
public class ModelBinderTests
{
    [Fact]
    public void Parameters_bind_in_order_and_overrides_propagate()
    {
        var toml = ModelText.Valid.Replace("ef = -200", "ef = -200\nV2 = \"V^2/t\"");
        var m = ModelText.Bind(toml);
        Assert.Equal(25, m.Parameters.Single(p => p.Key == "V2").Value, 12);
        var o = ModelText.Bind(toml, new Dictionary<string, string> { ["V"] = "sqrt(t)*3" });
        // V = 3 sqrt(100) = 30, V2 = 900/100 = 9: the override is an expression and later defaults follow it.
        Assert.Equal(30, o.Parameters.Single(p => p.Key == "V").Value, 12);
        Assert.Equal(9, o.Parameters.Single(p => p.Key == "V2").Value, 12);
        var hyb = o.Hoppings.Single(h => o.Orbitals[h.To].Kind == OrbitalKind.Correlated);
        Assert.Equal(new Complex(30, 0), hyb.Amplitude[0, 0]);
        Assert.Equal(Complex.Zero, hyb.Amplitude[0, 1]);
    }

    [Fact]
    public void Shell_defaults_and_orbital_order()
    {
        var m = ModelText.Bind(ModelText.Valid);
        Assert.Equal(["d", "f"], m.Orbitals.Select(o => o.Name));
        var shell = Assert.Single(m.Shells);
        Assert.Equal(1, shell.Orbital);
        Assert.Equal(2, shell.Degeneracy);
        Assert.Equal(1, shell.Constraint);
        Assert.Equal(-200, shell.Level);
        Assert.Equal("A", shell.Group);
        Assert.Equal(4, m.BasisSize);
        Assert.Equal(EnergyUnit.MilliElectronVolt, m.Unit);
    }

    [Fact]
    public void Solver_temperature_in_kelvin_is_converted_to_the_energy_unit()
    {
        // k_B T at 2 K in meV: 2 x 1.380649e-23 J / 1.602176634e-22 J = 0.17234 meV (CODATA 2018 exact constants).
        var m = ModelText.Bind(ModelText.Valid + "\n[solver]\ntemperature = \"2 K\"\nmesh = 16\nshifted = true\ntolerance = 1e-8\nmax_iterations = 50\n");
        var s = m.Solver!;
        Assert.Equal("2 K", s.TemperatureText);
        Assert.Equal(2 * 1.380649e-23 / 1.602176634e-22, s.Temperature!.Value, 12);
        Assert.Equal(16, s.Mesh);
        Assert.True(s.Shifted);
        Assert.Equal(1e-8, s.Tolerance);
        Assert.Equal(50, s.MaxIterations);
        var bare = ModelText.Bind(ModelText.Valid + "\n[solver]\ntemperature = 0.5\n").Solver!;
        Assert.Equal(0.5, bare.Temperature);
        Assert.Null(bare.Mesh);
    }

    [Fact]
    public void Unknown_solver_key_suggests_the_closest()
    {
        var e = ModelText.Error(ModelText.Valid + "\n[solver]\nmax_iteration = 5\n");
        Assert.Equal("solver.max_iteration", e.Field);
        Assert.Equal("max_iterations", e.Suggestion);
    }

    [Fact]
    public void Staggered_potential_defaults_to_plus_minus()
    {
        var toml = """
            [model]
            electrons_per_cell = 2
            [lattice]
            kind = "honeycomb"
            constant = 2.5
            [[site]]
            name = "A"
            orbitals = ["p"]
            [[site]]
            name = "B"
            orbitals = ["p"]
            [[staggered]]
            orbital = "p"
            amplitude = "0.5*4"
            """;
        var m = ModelText.Bind(toml);
        Assert.Equal(2, m.Onsite.Count);
        Assert.Equal(2.0, m.Onsite[0].Amplitude[0, 0].Real);
        Assert.Equal(-2.0, m.Onsite[1].Amplitude[1, 1].Real);
        // Default honeycomb basis: B at (a/2, a/(2 sqrt 3), 0).
        Assert.Equal(2.5 / (2 * Math.Sqrt(3)), m.Sites[1].Position.Y, 12);
    }

    [Fact]
    public void Zeeman_field_is_b_dot_sigma_on_the_chosen_orbitals()
    {
        var m = ModelText.Bind(ModelText.Valid + "\n[zeeman]\nfield = [\"1\", 0, \"-t/50\"]\nacts_on = \"correlated\"\n");
        var z = Assert.Single(m.Onsite);
        Assert.Equal(OrbitalKind.Correlated, m.Orbitals[z.Orbital].Kind);
        // B.sigma with B = (1, 0, -2): [[Bz, Bx - i By], [Bx + i By, -Bz]] = [[-2, 1], [1, 2]].
        Assert.Equal(new Complex(-2, 0), z.Amplitude[0, 0]);
        Assert.Equal(new Complex(1, 0), z.Amplitude[0, 1]);
        Assert.Equal(new Complex(1, 0), z.Amplitude[1, 0]);
        Assert.Equal(new Complex(2, 0), z.Amplitude[1, 1]);
    }

    [Fact]
    public void Explicit_bond_may_add_to_a_neighbour_shell()
    {
        // How a bond distortion is written: neighbour = 1 gives every bond, one explicit vector adds dt to one of them.
        var m = ModelBinder.Bind(ModelFile.Load(Path.Combine(ModelText.RepositoryRoot(), "models", "weyl-diamond.toml")));
        var ss = m.Hoppings.Where(h => h.From != h.To && m.Orbitals[h.From].Kind == OrbitalKind.Conduction
                                       && m.Orbitals[h.To].Kind == OrbitalKind.Conduction).ToList();
        Assert.Equal(5, ss.Count); // 4 nearest-neighbour bonds + the distortion on (0,0,0)
        Assert.Equal(2, ss.Count(h => h.R == (0, 0, 0)));
    }

    [Fact]
    public void SU_N_model_binds_with_identity_amplitudes()
    {
        var toml = ModelText.Valid.Replace("electrons_per_cell = 2", "electrons_per_cell = 3\nflavours = 4");
        var m = ModelText.Bind(toml);
        Assert.Equal(8, m.BasisSize);
        Assert.Equal(4, m.Shells[0].Degeneracy);
        Assert.Equal(new Complex(-100, 0), m.Hoppings[0].Amplitude[3, 3]);
    }

    [Fact]
    public void Flat_dos_model_keeps_its_half_width()
    {
        var m = ModelBinder.Bind(ModelFile.Load(Path.Combine(ModelText.RepositoryRoot(), "models", "flat-band.toml")));
        Assert.True(m.IsMomentumFree);
        Assert.Equal(LatticeKind.FlatDos, m.Lattice.Kind);
        Assert.Equal(1000, m.DosHalfWidth);
        Assert.Equal((0, 0, 0), Assert.Single(m.Hoppings).R);
    }

    [Fact]
    public void Explicit_lattice_vectors_are_in_units_of_the_constant()
    {
        var toml = ModelText.Valid.Replace("kind = \"simple-cubic\"", "kind = \"explicit\"\nvectors = [[1, 0, 0], [0, 1, 0], [0, 0, 2]]");
        var m = ModelText.Bind(toml);
        Assert.Equal(2 * 4.0 * 4.0 * 4.0, m.Lattice.CellVolume, 10);
        // Tetragonal cell a x a x 2a: the nearest shell is the 4 in-plane neighbours at a, stored as 2 (+ h.c.).
        var dd = m.Hoppings.Where(h => h.From == 0 && h.To == 0).ToList();
        Assert.Equal(2, dd.Count);
        Assert.All(dd, h => Assert.Equal(0, h.R.N3));
    }

    [Fact]
    public void Summary_lists_the_model()
    {
        var lines = ModelSummary.Describe(ModelText.Bind(ModelText.Valid));
        Assert.Contains("model: Test lattice", lines);
        Assert.Contains("bands: 4", lines);
        Assert.Contains("  t = 100", lines);
        Assert.Contains("  conduction bonds (h.c. implied): 3", lines);
        Assert.Contains("  hybridization bonds (h.c. implied): 1", lines);
        Assert.Contains(lines, l => l.StartsWith("lattice: SimpleCubic, a = 4 angstrom"));
        Assert.Contains(lines, l => l.Contains("A:f: N = 2, Q = 1, eps_f = -200 meV"));
    }

    [Theory]
    [InlineData("simple-cubic", LatticeKind.SimpleCubic, 3)]
    [InlineData("body-centred-cubic", LatticeKind.BodyCentredCubic, 3)]
    [InlineData("face-centred-cubic", LatticeKind.FaceCentredCubic, 3)]
    [InlineData("square", LatticeKind.Square, 2)]
    [InlineData("semi-elliptic-dos", LatticeKind.SemiEllipticDos, 0)]
    [InlineData("flat-dos", LatticeKind.FlatDos, 0)]
    public void Every_lattice_kind_name_binds(string name, LatticeKind kind, int dimension)
    {
        bool dos = dimension == 0;
        var toml = $$"""
            [model]
            electrons_per_cell = 1
            [lattice]
            kind = "{{name}}"
            {{(dos ? "half_width = 500" : "constant = 3.5")}}
            [[site]]
            name = "A"
            position = [0, 0, 0]
            orbitals = ["c"]
            [site.shell]
            level = -100
            [[hybridization]]
            from = "A:c"
            to = "A:f"
            amplitude = 50
            """;
        var m = ModelText.Bind(toml);
        Assert.Equal(kind, m.Lattice.Kind);
        Assert.Equal(dimension, m.Lattice.Dimension);
        Assert.Equal(dos ? 500 : 0, m.DosHalfWidth);
    }
}
