using Meanfield.Models;

namespace Meanfield.Tests.Models;

/// <summary>
/// Broken model files: each must raise a ModelError naming the right line, field and, for typos, the closest valid
/// name. Each case breaks one piece of <see cref="ModelText.Valid"/> (common practice for input validation).
/// </summary>
public class MalformedModelTests
{
    private static string Break(string oldText, string newText)
    {
        Assert.Contains(oldText, ModelText.Valid);
        return ModelText.Valid.Replace(oldText, newText);
    }

    private static ModelError Check(string toml, string marker, string field, string? suggestion = null, string? says = null)
    {
        var e = ModelText.Error(toml);
        Assert.Equal("test.toml", e.File);
        Assert.Equal(ModelText.LineOf(toml, marker), e.Line);
        Assert.Equal(field, e.Field);
        Assert.Equal(suggestion, e.Suggestion);
        if (says is not null) Assert.Contains(says, e.Message);
        Assert.StartsWith($"test.toml:{e.Line}:", e.Message);
        return e;
    }

    [Fact]
    public void Toml_syntax_error_names_line_and_column()
    {
        var toml = Break("V = 50", "V = = 50");
        var e = ModelText.Error(toml);
        Assert.Equal(ModelText.LineOf(toml, "V = = 50"), e.Line);
        Assert.NotNull(e.Column);
        Assert.Contains("TOML syntax error", e.Message);
    }

    [Fact]
    public void Unknown_key_suggests_the_closest() =>
        Check(Break("amplitude = \"-t\"", "amplitud = \"-t\""), "amplitud", "hopping[1].amplitud", "amplitude", "unknown key");

    [Fact]
    public void Unknown_table_suggests_the_closest() =>
        Check(Break("[[hybridization]]", "[[hybridisation]]"), "[[hybridisation]]", "hybridisation", "hybridization");

    [Fact]
    public void Unknown_key_in_a_shell() =>
        Check(Break("level = \"ef\"", "levle = \"ef\""), "levle", "site[1].shell.levle", "level");

    [Fact]
    public void Unknown_site_in_a_bond() =>
        Check(Break("to = \"A:d\"", "to = \"AA:d\""), "to = \"AA:d\"", "hopping[1].to", "A", "site 'AA' does not exist");

    [Fact]
    public void Unknown_orbital_on_a_site() =>
        Check(Break("from = \"A:d\"\nto = \"A:d\"", "from = \"A:dd\"\nto = \"A:d\""), "A:dd", "hopping[1].from", "d", "has no orbital 'dd'");

    [Fact]
    public void Unknown_parameter_points_at_its_column()
    {
        var toml = Break("amplitude = \"-t\"", "amplitude = \"-tt\"");
        var e = Check(toml, "-tt", "hopping[1].amplitude", "t", "unknown parameter 'tt'");
        Assert.Equal(15, e.Column); // amplitude = "-tt": the quote is column 13, '-' 14, 'tt' 15
    }

    [Fact]
    public void Hybridization_must_end_on_a_shell() =>
        Check(Break("to = \"A:f\"", "to = \"A:d\"  # here"), "# here", "hybridization[1].to", says: "must end on a correlated shell");

    [Fact]
    public void Duplicated_term_is_reported_on_the_second_block()
    {
        var toml = ModelText.Valid + "\n\n[[hybridization]]\nfrom = \"A:d\"\nto = \"A:f\"\namplitude = \"2*V\"\n";
        var e = ModelText.Error(toml);
        Assert.Equal("hybridization[2]", e.Field);
        Assert.Equal(ModelText.Valid.Split('\n').Length + 2, e.Line);
        Assert.Contains("duplicated term", e.Message);
    }

    [Fact]
    public void A_bond_and_its_reverse_are_a_duplicate()
    {
        var toml = ModelText.Valid + "\n[[hopping]]\nfrom = \"A:d\"\nto = \"A:d\"\nvector = [1, 0, 0]\namplitude = 1\n"
                                   + "\n[[hopping]] # reverse\nfrom = \"A:d\"\nto = \"A:d\"\nvector = [-1, 0, 0]\namplitude = 1\n";
        Check(toml, "# reverse", "hopping[3]", says: "hopping[2]");
    }

    [Fact]
    public void Expression_that_does_not_parse_points_at_the_character()
    {
        var toml = Break("amplitude = \"V\"", "amplitude = \"2*(V\"");
        var e = Check(toml, "2*(V", "hybridization[1].amplitude", says: "missing ')'");
        Assert.Equal(18, e.Column); // after the V: quote at 13, "2*(V" occupies 14..17
    }

    [Fact]
    public void Division_by_zero_names_the_field() =>
        Check(Break("amplitude = \"V\"", "amplitude = \"t/(V - 50)\""), "t/(V - 50)", "hybridization[1].amplitude", says: "division by zero");

    [Fact]
    public void Missing_electron_count_points_at_the_model_table() =>
        Check(Break("electrons_per_cell = 2\n", ""), "[model]", "model.electrons_per_cell", says: "required");

    [Fact]
    public void Electron_count_beyond_the_states_per_cell()
    {
        // 2 orbitals x 2 flavours = 4 states per cell.
        Check(Break("electrons_per_cell = 2", "electrons_per_cell = \"4 + V/100\""), "electrons_per_cell", "model.electrons_per_cell", says: "outside [0, 4]");
        Check(Break("electrons_per_cell = 2", "electrons_per_cell = -1"), "electrons_per_cell", "model.electrons_per_cell", says: "outside");
    }

    [Fact]
    public void Shell_degeneracy_must_equal_flavours() =>
        Check(Break("level = \"ef\"", "level = \"ef\"\ndegeneracy = 4"), "[site.shell]", "site[1].shell.degeneracy", says: "flavours = 2");

    [Fact]
    public void Pauli_terms_need_two_flavours()
    {
        // One flavour leaves room for the boson only with Q < 1.
        var toml = Break("electrons_per_cell = 2", "electrons_per_cell = 1\nflavours = 1").Replace("level = \"ef\"", "level = \"ef\"\nconstraint = 0.5")
                   + "\n[[onsite]]\norbital = \"A:d\"\nspin = { z = \"1\" }  # here\n";
        Check(toml, "# here", "onsite[1].spin", says: "flavours = 2");
    }

    [Fact]
    public void Two_shells_on_one_site()
    {
        var toml = Break("[site.shell]\nname = \"f\"\nlevel = \"ef\"", "[[site.shell]]\nname = \"f\"\nlevel = \"ef\"\n[[site.shell]] # second\nname = \"g\"\nlevel = \"ef\"");
        Check(toml, "# second", "site[1].shell", says: "more than one shell");
    }

    [Fact]
    public void Non_hermitian_onsite_energy()
    {
        var toml = ModelText.Valid + "\n[[onsite]]\norbital = \"A:d\"\nenergy = \"i*t\"  # here\n";
        Check(toml, "# here", "onsite[1].energy", says: "not Hermitian");
    }

    [Fact]
    public void Unknown_lattice_kind_suggests_the_closest() =>
        Check(Break("kind = \"simple-cubic\"", "kind = \"simple-cubik\""), "simple-cubik", "lattice.kind", "simple-cubic");

    [Fact]
    public void Explicit_lattice_needs_vectors() =>
        Check(Break("kind = \"simple-cubic\"", "kind = \"explicit\""), "[lattice]", "lattice.vectors", says: "missing");

    [Fact]
    public void Explicit_lattice_with_degenerate_vectors() =>
        Check(Break("kind = \"simple-cubic\"", "kind = \"explicit\"\nvectors = [[1, 0, 0], [0, 1, 0], [1, 1, 0]]"),
              "[lattice]", "lattice.vectors", says: "linearly dependent");

    [Fact]
    public void Neighbour_shell_out_of_range() =>
        Check(Break("neighbour = 1", "neighbour = 0"), "neighbour = 0", "hopping[1].neighbour", says: "between 1 and 10");

    [Fact]
    public void Neighbour_shell_with_no_bonds_on_a_momentum_free_lattice()
    {
        var toml = Break("kind = \"simple-cubic\"\nconstant = 4.0", "kind = \"flat-dos\"\nhalf_width = 1000");
        Check(toml, "[[hopping]]", "hopping[1]", says: "momentum-free");
    }

    [Fact]
    public void Spin_orbit_diamond_on_a_cubic_lattice()
    {
        var toml = ModelText.Valid + "\n[[spin_orbit_diamond]]  # here\norbital = \"d\"\namplitude = 5\n";
        Check(toml, "# here", "spin_orbit_diamond[1]", says: "diamond");
    }

    [Fact]
    public void Negative_lattice_constant() =>
        Check(Break("constant = 4.0", "constant = -4.0"), "constant = -4.0", "lattice.constant", says: "must be positive");

    [Fact]
    public void Empty_model_without_sites()
    {
        int start = ModelText.Valid.IndexOf("[[site]]", StringComparison.Ordinal);
        var e = ModelText.Error(ModelText.Valid[..start]);
        Assert.Equal("site", e.Field);
        Assert.Contains("empty model", e.Message);
    }

    [Fact]
    public void Empty_model_with_a_bare_site()
    {
        int start = ModelText.Valid.IndexOf("[[site]]", StringComparison.Ordinal);
        var toml = ModelText.Valid[..start] + "[[site]]\nname = \"A\"\nposition = [0, 0, 0]\n";
        Check(toml, "[[site]]", "site", says: "empty model");
    }

    [Fact]
    public void Parameter_must_be_real() =>
        Check(Break("V = 50", "V = \"50*i\""), "V = ", "parameters.V", says: "must be a real number");

    [Fact]
    public void Parameter_cannot_use_a_later_one() =>
        Check(Break("t = 100", "t = \"2*V\""), "t = ", "parameters.t", says: "'V' is defined after 't'");

    [Fact]
    public void Reserved_parameter_name() =>
        Check(Break("V = 50", "pi = 3"), "pi = 3", "parameters.pi", says: "reserved");

    [Fact]
    public void Not_a_number_is_rejected() =>
        Check(Break("constant = 4.0", "constant = nan"), "constant = nan", "lattice.constant", says: "finite number");

    [Fact]
    public void Site_position_is_required_without_a_default_basis() =>
        Check(Break("position = [0, 0, 0]\n", ""), "[[site]]", "site[1].position", says: "missing position");

    [Fact]
    public void Wrong_value_type() =>
        Check(Break("orbitals = [\"d\"]", "orbitals = \"d\""), "orbitals = \"d\"", "site[1].orbitals", says: "expected an array");

    [Fact]
    public void Orbital_reference_without_site() =>
        Check(Break("to = \"A:f\"", "to = \"f\""), "to = \"f\"", "hybridization[1].to", says: "site:orbital");

    [Fact]
    public void Unknown_energy_unit() =>
        Check(Break("electrons_per_cell = 2", "electrons_per_cell = 2\nenergy_unit = \"mev\""), "energy_unit", "model.energy_unit", "meV");

    [Fact]
    public void Duplicate_key_is_a_syntax_error()
    {
        var toml = Break("V = 50", "V = 50\nV = 60");
        var e = ModelText.Error(toml);
        Assert.Equal(ModelText.LineOf(toml, "V = 60"), e.Line);
    }

    [Fact]
    public void Unknown_override_suggests_the_closest_parameter()
    {
        var e = ModelText.Error(ModelText.Valid, new Dictionary<string, string> { ["ef0"] = "-100" });
        Assert.Equal(ModelBinder.OverrideSource, e.File);
        Assert.Null(e.Line);
        Assert.Equal("ef0", e.Field);
        Assert.Equal("ef", e.Suggestion);
        Assert.Equal("--set: ef0: unknown parameter 'ef0' (did you mean 'ef'?)", e.Message);
    }

    [Fact]
    public void Override_that_does_not_parse_gives_its_column()
    {
        var e = ModelText.Error(ModelText.Valid, new Dictionary<string, string> { ["V"] = "2*(t" });
        Assert.Equal("V", e.Field);
        Assert.Equal(5, e.Column);
    }

    [Fact]
    public void Missing_file_is_a_model_error()
    {
        var e = Assert.Throws<ModelError>(() => ModelFile.Load("/nonexistent/model.toml"));
        Assert.Equal("/nonexistent/model.toml", e.File);
    }
}
