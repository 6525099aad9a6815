using System.Globalization;
using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// The header of an exported model as key = value text: the CSV's "# key = value" comment lines and the Parquet file's
/// key-value metadata carry exactly these pairs, so a reader of either finds the same keys (models/README.md lists them).
/// </summary>
public static class OneBodyHeaderText
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The pairs in file order. Energies carry their unit in the key (chemical_potential_meV).</summary>
    public static IReadOnlyList<KeyValuePair<string, string>> ToPairs(OneBodyHeader h)
    {
        string u = h.Unit.Symbol();
        var lattice = h.Lattice;
        var pairs = new List<KeyValuePair<string, string>>();
        void Add(string key, string value) => pairs.Add(new(key, value));
        Add("format", OneBodyHeader.FormatTag);
        Add("model", h.Model);
        Add("renormalized", h.Renormalized ? "true" : "false");
        Add("energy_unit", u);
        Add("length_unit", "angstrom");
        Add("phase_includes_site_positions", "true");
        Add("phase", OneBodyHeader.PhaseText);
        Add($"chemical_potential_{u}", R(h.Mu));
        Add("chemical_potential_rule", h.MuRule);
        Add($"temperature_{u}", R(h.Temperature));
        Add("temperature_K", R(h.Temperature * h.Unit.Kelvins()));
        Add("electrons_per_cell", R(h.ElectronsPerCell));
        Add("formula_units_per_cell", R(h.FormulaUnitsPerCell));
        Add("lattice_kind", LatticeName(lattice.Kind));
        Add("lattice_dimension", lattice.Dimension.ToString(Inv));
        Add("lattice_constant_angstrom", R(lattice.Constant));
        Add("lattice_vector_1_angstrom", V(lattice.A1));
        Add("lattice_vector_2_angstrom", V(lattice.A2));
        Add("lattice_vector_3_angstrom", V(lattice.A3));
        Add("flavours", string.Join(" ", h.Flavours));
        for (int s = 0; s < h.Sites.Count; s++) Add($"site_{s + 1}", $"{h.Sites[s].Name} {V(h.Sites[s].Position)}");
        for (int o = 0; o < h.Orbitals.Count; o++)
            Add($"orbital_{o + 1}", $"{h.Orbitals[o].Label} {(h.Orbitals[o].Kind == OrbitalKind.Correlated ? "correlated" : "conduction")}");
        if (h.Mesh is int mesh) { Add("sampling_mesh", mesh.ToString(Inv)); Add("sampling_shifted", h.Shifted ? "true" : "false"); }
        Add("source", h.Source);
        Add("model_path", h.ModelPath);
        Add("model_sha256", h.ModelSha256);
        Add("tool_version", h.ToolVersion);
        Add("created", h.Created);
        return pairs;
    }

    /// <summary>The file name of a lattice kind (as in model files).</summary>
    public static string LatticeName(LatticeKind kind) => ModelFile.LatticeKinds.First(kv => kv.Value == kind).Key;

    /// <summary>
    /// The header from its pairs; <paramref name="where"/> gives the place of a key for messages (a CSV line; empty
    /// for Parquet metadata).
    /// </summary>
    /// <exception cref="OneBodyModelError">A key is missing, a value malformed or out of range.</exception>
    public static OneBodyHeader FromPairs(IReadOnlyDictionary<string, string> pairs, string path, Func<string, string> where)
    {
        string Get(string key) => pairs.TryGetValue(key, out var v) ? v.Trim()
            : throw new OneBodyModelError(path, "", key, "missing" + NameSuggestion.Format(NameSuggestion.Closest(key, pairs.Keys)));
        OneBodyModelError Bad(string key, string problem) => new(path, where(key), key, problem);
        double Number(string key)
        {
            var t = Get(key);
            return double.TryParse(t, NumberStyles.Float, Inv, out var v) && double.IsFinite(v) ? v : throw Bad(key, $"'{t}' is not a finite number");
        }
        Vec3 Vector(string key, string text)
        {
            var p = text.Split(' ', StringSplitOptions.RemoveEmptyEntries);
            var x = new double[3];
            if (p.Length != 3 || !p.Select((s, i) => double.TryParse(s, NumberStyles.Float, Inv, out x[i]) && double.IsFinite(x[i])).All(ok => ok))
                throw Bad(key, $"'{text}' is not three finite numbers x y z");
            return new Vec3(x[0], x[1], x[2]);
        }
        bool Flag(string key) => Get(key) switch { "true" => true, "false" => false, var t => throw Bad(key, $"'{t}' is neither true nor false") };

        if (Get("format") != OneBodyHeader.FormatTag) throw Bad("format", $"'{Get("format")}' is not '{OneBodyHeader.FormatTag}'");
        if (!EnergyUnits.TryParse(Get("energy_unit"), out var unit)) throw Bad("energy_unit", $"'{Get("energy_unit")}' is not meV, eV or K");
        if (Get("length_unit") != "angstrom") throw Bad("length_unit", $"'{Get("length_unit")}' is not angstrom");
        if (!Flag("phase_includes_site_positions"))
            throw Bad("phase_includes_site_positions", "only phases that include the site positions are read");
        string u = unit.Symbol();
        double mu = Number($"chemical_potential_{u}"), temperature = Number($"temperature_{u}");
        if (Math.Abs(mu) > PhysicalRange.MaxEnergy(unit)) throw Bad($"chemical_potential_{u}", $"beyond the physical range (at most {PhysicalRange.MaxEnergyText(unit)})");
        if (temperature < 0 || temperature > PhysicalRange.MaxEnergy(unit)) throw Bad($"temperature_{u}", $"must lie in 0..{PhysicalRange.MaxEnergyText(unit)}");
        var kindText = Get("lattice_kind");
        if (!ModelFile.LatticeKinds.TryGetValue(kindText, out var kind))
            throw Bad("lattice_kind", $"unknown lattice kind '{kindText}'" + NameSuggestion.Format(NameSuggestion.Closest(kindText, ModelFile.LatticeKinds.Keys)));
        if (kind.IsMomentumFree()) throw Bad("lattice_kind", $"'{kindText}' has no real-space lattice, so it has no matrix elements to read");
        double a = Number("lattice_constant_angstrom");
        if (a < PhysicalRange.MinLatticeConstant || a > PhysicalRange.MaxLatticeConstant)
            throw Bad("lattice_constant_angstrom", $"{R(a)} is outside {R(PhysicalRange.MinLatticeConstant)}..{R(PhysicalRange.MaxLatticeConstant)} angstrom");
        int dim = Get("lattice_dimension") switch { "2" => 2, "3" => 3, var t => throw Bad("lattice_dimension", $"'{t}' is neither 2 nor 3") };
        Lattice lattice;
        try
        {
            lattice = new Lattice(kind, a, dim, Vector("lattice_vector_1_angstrom", Get("lattice_vector_1_angstrom")),
                Vector("lattice_vector_2_angstrom", Get("lattice_vector_2_angstrom")), Vector("lattice_vector_3_angstrom", Get("lattice_vector_3_angstrom")));
        }
        catch (ArgumentException e) { throw Bad("lattice_vector_1_angstrom", e.Message); }
        var flavours = Get("flavours").Split(' ', StringSplitOptions.RemoveEmptyEntries);
        if (flavours.Length < 1 || flavours.Length > ModelFile.MaxFlavours || flavours.Distinct().Count() != flavours.Length)
            throw Bad("flavours", $"expected 1..{ModelFile.MaxFlavours} distinct names, found '{Get("flavours")}'");
        var sites = new List<Site>();
        for (int s = 1; pairs.ContainsKey($"site_{s}"); s++)
        {
            var key = $"site_{s}";
            var t = Get(key);
            int sp = t.IndexOf(' ');
            if (sp <= 0) throw Bad(key, $"'{t}' is not 'NAME x y z'");
            var name = t[..sp];
            if (sites.Any(x => x.Name == name)) throw Bad(key, $"site '{name}' is listed twice");
            var pos = Vector(key, t[(sp + 1)..]);
            if (pos.Norm > PhysicalRange.MaxReducedCoordinate * a) throw Bad(key, "position beyond the physical range");
            sites.Add(new Site(name, pos));
        }
        if (sites.Count == 0) throw new OneBodyModelError(path, "", "site_1", "missing: the basis lists no site");
        var orbitals = new List<OneBodyOrbital>();
        for (int o = 1; pairs.ContainsKey($"orbital_{o}"); o++)
        {
            var key = $"orbital_{o}";
            var p = Get(key).Split(' ', StringSplitOptions.RemoveEmptyEntries);
            if (p.Length != 2 || p[0].IndexOf(':') <= 0 || p[0].EndsWith(':'))
                throw Bad(key, $"'{Get(key)}' is not 'SITE:NAME conduction|correlated'");
            var siteName = p[0][..p[0].IndexOf(':')];
            int site = sites.FindIndex(x => x.Name == siteName);
            if (site < 0) throw Bad(key, $"site '{siteName}' is not listed" + NameSuggestion.Format(NameSuggestion.Closest(siteName, sites.Select(x => x.Name))));
            var kindOf = p[1] switch { "conduction" => OrbitalKind.Conduction, "correlated" => OrbitalKind.Correlated, _ => throw Bad(key, $"kind '{p[1]}' is neither conduction nor correlated") };
            if (orbitals.Any(x => x.Label == p[0])) throw Bad(key, $"orbital '{p[0]}' is listed twice");
            orbitals.Add(new OneBodyOrbital(p[0], site, kindOf));
        }
        if (orbitals.Count == 0) throw new OneBodyModelError(path, "", "orbital_1", "missing: the basis lists no orbital");
        double ne = Number("electrons_per_cell");
        if (ne <= 0 || ne > orbitals.Count * flavours.Length)
            throw Bad("electrons_per_cell", $"{R(ne)} is outside 0..{orbitals.Count * flavours.Length} (the number of states per cell)");
        double fu = Number("formula_units_per_cell");
        if (fu <= 0 || fu > PhysicalRange.MaxFormulaUnitsPerCell) throw Bad("formula_units_per_cell", $"{R(fu)} is outside 0..{R(PhysicalRange.MaxFormulaUnitsPerCell)}");
        int? mesh = null;
        if (pairs.ContainsKey("sampling_mesh"))
        {
            var t = Get("sampling_mesh");
            mesh = int.TryParse(t, NumberStyles.None, Inv, out var m) && m >= PhysicalRange.MinMesh && m <= PhysicalRange.MaxMesh
                ? m : throw Bad("sampling_mesh", $"'{t}' is not a whole number in {PhysicalRange.MinMesh}..{PhysicalRange.MaxMesh}");
        }
        return new OneBodyHeader
        {
            Model = Get("model"), Renormalized = Flag("renormalized"), Unit = unit, Mu = mu, MuRule = Get("chemical_potential_rule"),
            Temperature = temperature, ElectronsPerCell = ne, FormulaUnitsPerCell = fu, Lattice = lattice, Flavours = flavours,
            Sites = sites, Orbitals = orbitals, Mesh = mesh, Shifted = !pairs.ContainsKey("sampling_shifted") || Flag("sampling_shifted"),
            Source = pairs.GetValueOrDefault("source") ?? "", ModelPath = pairs.GetValueOrDefault("model_path") ?? "",
            ModelSha256 = pairs.GetValueOrDefault("model_sha256") ?? "", ToolVersion = pairs.GetValueOrDefault("tool_version") ?? "",
            Created = pairs.GetValueOrDefault("created") ?? "",
        };
    }

    private static string R(double x) => x.ToString("R", Inv);
    private static string V(Vec3 v) => $"{R(v.X)} {R(v.Y)} {R(v.Z)}";
}
