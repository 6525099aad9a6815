using System.Globalization;
using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Models;

/// <summary>
/// Reads a model file (TOML, format described in models/README.md) into a symbolic <see cref="ModelSpec"/>.
/// Checks the shape of the file here (syntax, keys, types, expression syntax); names and numbers are checked when
/// binding. Every problem is a <see cref="ModelError"/>.
/// </summary>
public static class ModelFile
{
    private static readonly string[] RootKeys = ["model", "parameters", "lattice", "site", "hopping", "hybridization",
        "ff_hopping", "onsite", "staggered", "zeeman", "spin_orbit_diamond", "solver"];
    private static readonly string[] ModelKeys = ["name", "energy_unit", "formula_units_per_cell", "electrons_per_cell", "flavours"];
    private static readonly string[] LatticeKeys = ["kind", "constant", "vectors", "half_width"];
    private static readonly string[] SiteKeys = ["name", "position", "orbitals", "shell"];
    private static readonly string[] ShellKeys = ["name", "level", "degeneracy", "constraint", "group", "U"];
    private static readonly string[] BondKeys = ["from", "to", "vector", "neighbour", "amplitude", "spin"];
    private static readonly string[] SpinKeys = ["identity", "x", "y", "z"];
    private static readonly string[] OnsiteKeys = ["orbital", "energy", "spin"];
    private static readonly string[] StaggeredKeys = ["orbital", "amplitude", "signs"];
    private static readonly string[] ZeemanKeys = ["field", "acts_on"];
    private static readonly string[] SpinOrbitKeys = ["orbital", "amplitude"];
    private static readonly string[] SolverKeys = ["temperature", "mesh", "shifted", "tolerance", "max_iterations", "symmetry"];

    /// <summary>Lattice kinds by their model-file names.</summary>
    public static readonly IReadOnlyDictionary<string, LatticeKind> LatticeKinds = new Dictionary<string, LatticeKind>
    {
        ["simple-cubic"] = LatticeKind.SimpleCubic, ["body-centred-cubic"] = LatticeKind.BodyCentredCubic,
        ["face-centred-cubic"] = LatticeKind.FaceCentredCubic, ["diamond"] = LatticeKind.Diamond,
        ["square"] = LatticeKind.Square, ["honeycomb"] = LatticeKind.Honeycomb, ["explicit"] = LatticeKind.Explicit,
        ["flat-dos"] = LatticeKind.FlatDos, ["semi-elliptic-dos"] = LatticeKind.SemiEllipticDos,
    };

    /// <summary>Largest number of flavours (and shell degeneracy): SU(16) is beyond any model in use (common practice).</summary>
    public const int MaxFlavours = 16;

    /// <summary>Reads and parses the file at <paramref name="path"/>.</summary>
    public static ModelSpec Load(string path)
    {
        string text;
        Utf8Text.InvalidByte? invalid;
        try { text = Utf8Text.Read(path, out invalid); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new ModelError(new SourceLocation(path, null, null), "", $"cannot read the model file: {e.Message}");
        }
        if (invalid is { } bad) throw new ModelError(new SourceLocation(path, bad.Line, bad.Column), "", bad.Problem);
        return Parse(text, path);
    }

    /// <summary>Parses model-file text; <paramref name="sourceName"/> names it in messages.</summary>
    public static ModelSpec Parse(string text, string sourceName)
    {
        var root = new TableReader(TomlTreeBuilder.Build(text, sourceName), "", RootKeys);
        var model = root.Table("model", ModelKeys)
            ?? throw new ModelError(new SourceLocation(sourceName, 1, 1), "model", "missing [model] table");
        var header = ReadHeader(model);
        var latticeTable = root.Table("lattice", LatticeKeys)
            ?? throw new ModelError(new SourceLocation(sourceName, 1, 1), "lattice", "missing [lattice] table");
        return new ModelSpec
        {
            SourceName = sourceName,
            SourceText = text,
            Header = header,
            Parameters = ReadParameters(root),
            Lattice = ReadLattice(latticeTable),
            Sites = Blocks(root, "site", SiteKeys).Select(ReadSite).ToList(),
            Bonds = [.. Blocks(root, "hopping", BondKeys).Select(t => ReadBond(t, BondKind.Hopping)),
                     .. Blocks(root, "hybridization", BondKeys).Select(t => ReadBond(t, BondKind.Hybridization)),
                     .. Blocks(root, "ff_hopping", BondKeys).Select(t => ReadBond(t, BondKind.FfHopping))],
            Onsite = Blocks(root, "onsite", OnsiteKeys).Select(t =>
                new OnsiteSpec(ReadOrbitalRef(t, "orbital"), ReadAmplitude(t, "energy"), t.Path, t.Location)).ToList(),
            Staggered = Blocks(root, "staggered", StaggeredKeys).Select(ReadStaggered).ToList(),
            Zeeman = root.Table("zeeman", ZeemanKeys) is { } z ? ReadZeeman(z) : null,
            SpinOrbit = Blocks(root, "spin_orbit_diamond", SpinOrbitKeys).Select(t => new SpinOrbitDiamondSpec(
                t.String("orbital", true)!, t.Expression("amplitude", true)!, t.Path, t.Location)).ToList(),
            Solver = root.Table("solver", SolverKeys) is { } s ? ReadSolver(s, header.Unit) : null,
        };
    }

    /// <summary>The tables of a [[key]] array, each under the path "key[n]" (n from 1).</summary>
    private static List<TableReader> Blocks(TableReader root, string key, string[] keys)
    {
        var e = root.Entry(key);
        if (e is null) return [];
        IEnumerable<TomlNode> tables = e.Value switch
        {
            TomlTableArray a => a.Tables,
            TomlList l => l.Items,
            _ => throw new ModelError(e.KeyLocation, key, $"write each {key} as a [[{key}]] block, found {e.Value.Describe}"),
        };
        var list = new List<TableReader>();
        int n = 0;
        foreach (var t in tables)
        {
            n++;
            var table = t as TomlTable ?? throw TableReader.WrongType(t, $"{key}[{n}]", "a table");
            list.Add(new TableReader(table, $"{key}[{n}]", keys));
        }
        return list;
    }

    private static ModelHeader ReadHeader(TableReader t)
    {
        string name = t.String("name") ?? "unnamed model";
        var unit = EnergyUnit.MilliElectronVolt;
        if (t.String("energy_unit") is { } u && !EnergyUnits.TryParse(u, out unit))
            throw new ModelError(t.Entry("energy_unit")!.Value.Location, t.Field("energy_unit"),
                $"unknown energy unit '{u}': use \"meV\", \"eV\" or \"K\"", NameSuggestion.Closest(u, ["meV", "eV", "K"]));
        var formula = t.Expression("formula_units_per_cell") ?? ModelExpression.Constant(1, t.Field("formula_units_per_cell"), t.Location);
        var electrons = t.Expression("electrons_per_cell")
            ?? throw t.Missing("electrons_per_cell", "electron count per unit cell (a number or an expression); it is required");
        long flavours = t.Integer("flavours") ?? 2;
        if (flavours < 1 || flavours > MaxFlavours)
            throw new ModelError(t.Entry("flavours")!.Value.Location, t.Field("flavours"), $"flavours must be between 1 and {MaxFlavours}, found {flavours}");
        return new ModelHeader(name, unit, formula, electrons, (int)flavours, t.Location);
    }

    private static List<ParameterSpec> ReadParameters(TableReader root)
    {
        var e = root.Entry("parameters");
        if (e is null) return [];
        var table = e.Value as TomlTable ?? throw TableReader.WrongType(e.Value, "parameters", "a table");
        var list = new List<ParameterSpec>();
        foreach (var p in table.Entries)
        {
            string field = $"parameters.{p.Key}";
            if (!IsIdentifier(p.Key))
                throw new ModelError(p.KeyLocation, field, $"'{p.Key}' is not a parameter name: use letters, digits and '_', starting with a letter");
            if (ExpressionParser.Reserved.Contains(p.Key))
                throw new ModelError(p.KeyLocation, field, $"'{p.Key}' is reserved (constant or function) and cannot be a parameter");
            list.Add(new ParameterSpec(p.Key, TableReader.AsExpression(p.Value, field), p.KeyLocation));
        }
        return list;
    }

    private static void CheckReduced(double[] v, TomlNode node, string field)
    {
        for (int k = 0; k < v.Length; k++)
            if (Math.Abs(v[k]) > PhysicalRange.MaxReducedCoordinate)
                throw new ModelError(node is TomlList l && k < l.Items.Count ? l.Items[k].Location : node.Location, $"{field}[{k + 1}]",
                    string.Create(CultureInfo.InvariantCulture, $"{v[k]:G6} is outside the physical range: components are in units of the lattice constant, at most {PhysicalRange.MaxReducedCoordinate:G3} in magnitude"));
    }

    internal static bool IsIdentifier(string s) =>
        s.Length > 0 && (char.IsLetter(s[0]) || s[0] == '_') && s.All(c => char.IsLetterOrDigit(c) || c == '_');

    private static LatticeSpec ReadLattice(TableReader t)
    {
        string kindText = t.String("kind", true)!;
        if (!LatticeKinds.TryGetValue(kindText, out var kind))
            throw new ModelError(t.Entry("kind")!.Value.Location, t.Field("kind"), $"unknown lattice kind '{kindText}'",
                NameSuggestion.Closest(kindText, LatticeKinds.Keys));
        List<Vec3>? vectors = null;
        if (t.List("vectors") is { } list)
        {
            if (kind != LatticeKind.Explicit)
                throw new ModelError(list.Location, t.Field("vectors"), $"vectors are only read for kind = \"explicit\", not \"{kindText}\"");
            if (list.Items.Count != 3)
                throw new ModelError(list.Location, t.Field("vectors"), $"expected three Bravais vectors [[..],[..],[..]], found {list.Items.Count}");
            vectors = [];
            for (int k = 0; k < 3; k++)
            {
                string field = $"{t.Field("vectors")}[{k + 1}]";
                var v = TableReader.AsNumbers(list.Items[k], field, 3);
                CheckReduced(v, list.Items[k], field);
                var vector = new Vec3(v[0], v[1], v[2]);
                if (vector.Norm < PhysicalRange.MinReducedVectorLength)
                    throw new ModelError(list.Items[k].Location, field, string.Create(CultureInfo.InvariantCulture,
                        $"Bravais vector of length {vector.Norm:G3} (units of the constant) is shorter than {PhysicalRange.MinReducedVectorLength:G3}: a zero or vanishing cell"));
                vectors.Add(vector);
            }
        }
        else if (kind == LatticeKind.Explicit)
            throw t.Missing("vectors", "Bravais vectors (kind = \"explicit\" needs vectors = [[..],[..],[..]] in units of the constant)");
        var constant = t.Expression("constant");
        var halfWidth = t.Expression("half_width");
        bool dos = kind.IsMomentumFree();
        if (!dos && constant is null) throw t.Missing("constant", "lattice constant in angstrom");
        if (dos && halfWidth is null) throw t.Missing("half_width", "half-width D of the conduction DOS (energy unit)");
        if (!dos && halfWidth is not null)
            throw new ModelError(halfWidth.Location, t.Field("half_width"), "half_width is only read for the DOS kinds (flat-dos, semi-elliptic-dos)");
        return new LatticeSpec(kind, constant, vectors, halfWidth, t.Location);
    }

    private static SiteSpec ReadSite(TableReader t)
    {
        string name = t.String("name", true)!;
        if (name.Length == 0 || name.Contains(':'))
            throw new ModelError(t.Entry("name")!.Value.Location, t.Field("name"), $"site name '{name}' must be non-empty and free of ':'");
        Vec3? position = null;
        if (t.Entry("position") is { } p)
        {
            var v = TableReader.AsNumbers(p.Value, t.Field("position"), 3);
            CheckReduced(v, p.Value, t.Field("position"));
            position = new Vec3(v[0], v[1], v[2]);
        }
        var orbitals = new List<string>();
        if (t.List("orbitals") is { } list)
            for (int k = 0; k < list.Items.Count; k++)
            {
                string field = $"{t.Field("orbitals")}[{k + 1}]";
                var o = list.Items[k] is TomlScalar { Value: string s, IsDate: false } ? s : throw TableReader.WrongType(list.Items[k], field, "an orbital name in quotes");
                if (o.Length == 0 || o.Contains(':')) throw new ModelError(list.Items[k].Location, field, $"orbital name '{o}' must be non-empty and free of ':'");
                if (orbitals.Contains(o)) throw new ModelError(list.Items[k].Location, field, $"orbital '{o}' is listed twice on site '{name}'");
                orbitals.Add(o);
            }
        ShellSpec? shell = null;
        if (t.Entry("shell") is { Value: TomlTableArray or TomlList } many)
        {
            var items = many.Value is TomlTableArray a ? a.Tables.Cast<TomlNode>().ToList() : ((TomlList)many.Value).Items.ToList();
            throw new ModelError(items.Count > 1 ? items[1].Location : many.Value.Location, t.Field("shell"), items.Count > 1
                ? $"site '{name}' has more than one shell: a site carries at most one correlated shell"
                : "write the shell as one [site.shell] table: a site carries at most one correlated shell");
        }
        if (t.Table("shell", ShellKeys) is { } sh)
        {
            var s = sh;
            string shellName = s.String("name") ?? "f";
            if (orbitals.Contains(shellName))
                throw new ModelError(s.Location, s.Field("name"), $"shell name '{shellName}' is already a conduction orbital of site '{name}'");
            long? degeneracy = s.Integer("degeneracy");
            if (degeneracy is < 1 or > MaxFlavours)
                throw new ModelError(s.Entry("degeneracy")!.Value.Location, s.Field("degeneracy"), $"degeneracy must be between 1 and {MaxFlavours}, found {degeneracy}");
            var constraint = s.Expression("constraint") ?? ModelExpression.Constant(1, s.Field("constraint"), s.Location);
            shell = new ShellSpec(shellName, s.Expression("level", true)!, degeneracy is null ? null : (int)degeneracy,
                                  constraint, s.String("group"), s.Path, s.Location, s.Expression("U"));
        }
        return new SiteSpec(name, position, orbitals, shell, t.Path, t.Location);
    }

    private static OrbitalRef ReadOrbitalRef(TableReader t, string key)
    {
        string text = t.String(key, true)!;
        var where = t.Entry(key)!.Value.Location;
        int colon = text.IndexOf(':');
        if (colon <= 0 || colon == text.Length - 1 || text.IndexOf(':', colon + 1) >= 0)
            throw new ModelError(where, t.Field(key), $"'{text}' is not of the form \"site:orbital\", for example \"A:d\"");
        return new OrbitalRef(text[..colon].Trim(), text[(colon + 1)..].Trim(), t.Field(key), where);
    }

    private static BondSpec ReadBond(TableReader t, BondKind kind)
    {
        var from = ReadOrbitalRef(t, "from");
        var to = ReadOrbitalRef(t, "to");
        (int, int, int)? vector = null;
        int? neighbour = null;
        if (t.Entry("vector") is { } v)
        {
            var list = v.Value as TomlList;
            if (list is null || list.Items.Count != 3 || list.Items.Any(x => x is not TomlScalar { Value: long }))
                throw TableReader.WrongType(v.Value, t.Field("vector"), "three integers [n1, n2, n3] (lattice-vector coordinates)");
            var n = list.Items.Select(x => (long)((TomlScalar)x).Value).ToArray();
            for (int k = 0; k < 3; k++)
                if (Math.Abs(n[k]) > PhysicalRange.MaxBondCells) // checked before the cast: 4294967296 must not wrap to 0
                    throw new ModelError(list.Items[k].Location, $"{t.Field("vector")}[{k + 1}]",
                        $"bond vector component {n[k]} is outside -{PhysicalRange.MaxBondCells}..{PhysicalRange.MaxBondCells} cells");
            vector = ((int)n[0], (int)n[1], (int)n[2]);
        }
        if (t.Integer("neighbour") is long shell)
        {
            if (vector is not null)
                throw new ModelError(t.Entry("neighbour")!.KeyLocation, t.Field("neighbour"), "give either vector or neighbour, not both");
            if (shell < 1 || shell > 10)
                throw new ModelError(t.Entry("neighbour")!.Value.Location, t.Field("neighbour"), $"neighbour shell must be between 1 and 10, found {shell}");
            neighbour = (int)shell;
        }
        if (vector is null && neighbour is null)
        {
            if (kind != BondKind.Hybridization) throw t.Missing("vector", "bond: give vector = [n1, n2, n3] or neighbour = n");
            vector = (0, 0, 0);
        }
        return new BondSpec(kind, from, to, vector, neighbour, ReadAmplitude(t, "amplitude"), t.Path, t.Location);
    }

    /// <summary>Either key = "expr" (times the identity) or spin = { identity, x, y, z }.</summary>
    private static AmplitudeSpec ReadAmplitude(TableReader t, string key)
    {
        var scalar = t.Expression(key);
        var spin = t.Table("spin", SpinKeys);
        if (scalar is not null && spin is not null)
            throw new ModelError(t.Entry("spin")!.KeyLocation, t.Field("spin"), $"give either {key} or spin, not both");
        if (scalar is not null) return new AmplitudeSpec(scalar, null, null, null, null, t.Field(key), scalar.Location);
        if (spin is null) throw t.Missing(key, $"{key} (or a spin = {{ identity, x, y, z }} matrix)");
        if (!SpinKeys.Any(spin.Has)) throw new ModelError(spin.Location, spin.Path, "spin matrix has no coefficient: give identity, x, y or z");
        return new AmplitudeSpec(null, spin.Expression("identity"), spin.Expression("x"), spin.Expression("y"),
                                 spin.Expression("z"), spin.Path, spin.Location);
    }

    private static StaggeredSpec ReadStaggered(TableReader t)
    {
        List<SiteSign>? signs = null;
        if (t.Entry("signs") is { } e)
        {
            var table = e.Value as TomlTable ?? throw TableReader.WrongType(e.Value, t.Field("signs"), "a table { A = 1, B = -1 }");
            signs = table.Entries.Select(e => new SiteSign(e.Key, TableReader.AsNumber(e.Value, $"{t.Field("signs")}.{e.Key}"), e.KeyLocation)).ToList();
        }
        return new StaggeredSpec(t.String("orbital", true)!, t.Expression("amplitude", true)!, signs, t.Path, t.Location);
    }

    private static ZeemanSpec ReadZeeman(TableReader t)
    {
        var list = t.List("field") ?? throw t.Missing("field", "field = [\"bx\", \"by\", \"bz\"] (energy unit)");
        if (list.Items.Count != 3) throw new ModelError(list.Location, t.Field("field"), $"expected 3 components, found {list.Items.Count}");
        var field = list.Items.Select((x, k) => TableReader.AsExpression(x, $"{t.Field("field")}[{k + 1}]")).ToList();
        string acts = t.String("acts_on") ?? "all";
        var target = acts switch
        {
            "all" => ZeemanTarget.All, "conduction" => ZeemanTarget.Conduction, "correlated" => ZeemanTarget.Correlated,
            _ => throw new ModelError(t.Entry("acts_on")!.Value.Location, t.Field("acts_on"), $"unknown target '{acts}': use \"all\", \"conduction\" or \"correlated\"",
                     NameSuggestion.Closest(acts, ["all", "conduction", "correlated"])),
        };
        return new ZeemanSpec(field, target, t.Location);
    }

    private static SolverHints ReadSolver(TableReader t, EnergyUnit unit)
    {
        string? text = null;
        double? temperature = null;
        if (t.Entry("temperature") is { } e)
        {
            if (e.Value is TomlScalar { Value: string s, IsDate: false }) { text = s; temperature = ParseTemperature(s, unit, e.Value.Location, t.Field("temperature")); }
            else { temperature = TableReader.AsNumber(e.Value, t.Field("temperature")); text = temperature.Value.ToString("R", CultureInfo.InvariantCulture); }
            if (temperature < 0) throw new ModelError(e.Value.Location, t.Field("temperature"), "temperature must not be negative");
            PhysicalRange.CheckEnergy(temperature!.Value, unit, e.Value.Location, t.Field("temperature"), "temperature");
        }
        long? mesh = t.Integer("mesh");
        if (mesh is < PhysicalRange.MinMesh or > PhysicalRange.MaxMesh)
            throw new ModelError(t.Entry("mesh")!.Value.Location, t.Field("mesh"), $"mesh must be between {PhysicalRange.MinMesh} and {PhysicalRange.MaxMesh} divisions, found {mesh}");
        double? tolerance = t.Number("tolerance");
        if (tolerance is <= 0) throw new ModelError(t.Entry("tolerance")!.Value.Location, t.Field("tolerance"), "tolerance must be positive");
        long? iterations = t.Integer("max_iterations");
        if (iterations is < 1 or > PhysicalRange.MaxIterations)
            throw new ModelError(t.Entry("max_iterations")!.Value.Location, t.Field("max_iterations"), $"max_iterations must be between 1 and {PhysicalRange.MaxIterations}, found {iterations}");
        string? symmetry = t.String("symmetry");
        if (symmetry is not null && symmetry.Trim().Length == 0)
            throw new ModelError(t.Entry("symmetry")!.Value.Location, t.Field("symmetry"), "write \"auto\", \"none\" or operations such as \"3[111],m[1-10]\"");
        return new SolverHints(text, temperature, (int?)mesh, t.Boolean("shifted"), tolerance, (int?)iterations,
                               symmetry, t.Entry("symmetry")?.Value.Location);
    }

    /// <summary>"2 K", "0.5 meV", "1e-3 eV" or a bare number in the model's energy unit, converted to that unit.</summary>
    private static double ParseTemperature(string s, EnergyUnit unit, SourceLocation where, string field)
    {
        var parsed = EnergyText.Parse(s);
        if (!parsed.Success)
        {
            string suffix = new(s.Trim().Reverse().TakeWhile(char.IsLetter).Reverse().ToArray());
            throw new ModelError(where, field, $"cannot read temperature \"{s}\": {parsed.Error}",
                suffix.Length > 0 ? NameSuggestion.Closest(suffix, ["K", "meV", "eV"]) : null);
        }
        return parsed.Quantity.In(unit);
    }
}
