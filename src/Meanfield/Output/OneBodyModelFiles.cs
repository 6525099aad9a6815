using System.Globalization;
using System.Numerics;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using Meanfield.Lattices;
using Meanfield.Units;
using Parquet;
using Parquet.Schema;

namespace Meanfield.Output;

/// <summary>
/// An exported one-body model read back: the plain model (no correlated shell), with the chemical potential,
/// temperature and sampling of the solution it came from.
/// </summary>
/// <param name="Model">The one-body model; its SourcePath is the exported file, its SourceText the file's text.</param>
/// <param name="Header">Everything the file says about itself.</param>
public sealed record ExportedModel(Binding.BoundModel Model, OneBodyHeader Header);

/// <summary>
/// Writes and reads meanfield's exported one-body models in three forms with the same content (models/README.md,
/// "Exported models"): JSON (header fields and an `elements` list), CSV ("# key = value" comment lines, then one row
/// per matrix element) and Parquet (the same pairs as file metadata, units and descriptions also in every column's
/// own metadata). Each row is one matrix element t = &lt;from, cell 0 | H | to, cell R&gt;.
/// </summary>
public static partial class OneBodyModelFiles
{
    [System.Text.RegularExpressions.GeneratedRegex("\"format\"\\s*:\\s*\"meanfield-one-body-model/1\"")]
    private static partial System.Text.RegularExpressions.Regex JsonFormatTag();

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>The element columns for energy unit <paramref name="unit"/>: name, unit ("1" for counts, "text" for names), meaning.</summary>
    public static IReadOnlyList<TableColumn> Columns(EnergyUnit unit)
    {
        string u = unit.Symbol();
        return
        [
            new("cell_a1", "1", "R along a1: integer coordinate of the cell of the 'to' orbital"),
            new("cell_a2", "1", "R along a2"),
            new("cell_a3", "1", "R along a3"),
            new("from_orbital", "text", "orbital a of the home cell, SITE:NAME"),
            new("from_flavour", "text", "flavour of a (see 'flavours')"),
            new("to_orbital", "text", "orbital b of cell R, SITE:NAME"),
            new("to_flavour", "text", "flavour of b"),
            new($"amplitude_real_{u}", u, "real part of t = <a, 0|H|b, R>"),
            new($"amplitude_imag_{u}", u, "imaginary part of t"),
            new("displacement_x_angstrom", "angstrom", "x of R + tau_b - tau_a (the vector in the Bloch phase)"),
            new("displacement_y_angstrom", "angstrom", "y of R + tau_b - tau_a"),
            new("displacement_z_angstrom", "angstrom", "z of R + tau_b - tau_a"),
        ];
    }

    /// <summary>Writes <paramref name="model"/> as .json, .csv or .parquet (by extension), atomically.</summary>
    /// <exception cref="ArgumentException">Another extension (callers check it first).</exception>
    public static void Save(OneBodyModel model, string path)
    {
        var ext = AtomicFile.IsStandardOutput(path) ? ".json" : Path.GetExtension(path).ToLowerInvariant();
        switch (ext)
        {
            case ".json": AtomicFile.WriteText(path, ToJson(model)); break;
            case ".csv": AtomicFile.WriteText(path, ToCsv(model)); break;
            case ".parquet": AtomicFile.WriteAsync(path, s => WriteParquet(model, s)).GetAwaiter().GetResult(); break;
            default: throw new ArgumentException($"{path}: use .json, .csv or .parquet for an exported model");
        }
    }

    private static Vec3 Displacement(OneBodyHeader h, OneBodyElement e) =>
        h.Lattice.LatticeVector(e.Cell.N1, e.Cell.N2, e.Cell.N3) + h.Sites[h.Orbitals[e.To].Site].Position - h.Sites[h.Orbitals[e.From].Site].Position;

    private static string R(double x) => x.ToString("R", Inv);

    // ---------- CSV ----------

    /// <summary>The CSV text: a title line, "# key = value" lines, "# column NAME [UNIT]: meaning" lines, header, rows.</summary>
    public static string ToCsv(OneBodyModel model)
    {
        var h = model.Header;
        var sb = new StringBuilder();
        sb.Append("# meanfield one-body model: one row per matrix element t = <from, cell 0|H|to, cell R>\n");
        foreach (var (key, value) in OneBodyHeaderText.ToPairs(h)) sb.Append("# ").Append(key).Append(" = ").Append(value.Replace('\n', ' ')).Append('\n');
        var cols = Columns(h.Unit);
        foreach (var c in cols) sb.Append("# column ").Append(c.Name).Append(" [").Append(c.Unit).Append("]: ").Append(c.Description).Append('\n');
        sb.Append(string.Join(",", cols.Select(c => c.Name))).Append('\n');
        foreach (var e in model.Elements)
        {
            var d = Displacement(h, e);
            sb.Append(Inv, $"{e.Cell.N1},{e.Cell.N2},{e.Cell.N3},{h.Orbitals[e.From].Label},{h.Flavours[e.FromFlavour]},{h.Orbitals[e.To].Label},{h.Flavours[e.ToFlavour]},");
            sb.Append(R(e.Amplitude.Real)).Append(',').Append(R(e.Amplitude.Imaginary)).Append(',');
            sb.Append(R(d.X)).Append(',').Append(R(d.Y)).Append(',').Append(R(d.Z)).Append('\n');
        }
        return sb.ToString();
    }

    private static ExportedModel ReadCsv(string path, string text)
    {
        var lines = text.Split('\n');
        var pairs = new Dictionary<string, string>(StringComparer.Ordinal);
        var lineOf = new Dictionary<string, int>(StringComparer.Ordinal);
        int i = 0;
        for (; i < lines.Length && lines[i].StartsWith('#'); i++)
        {
            var body = lines[i][1..].Trim();
            int eq = body.IndexOf(" = ", StringComparison.Ordinal);
            if (body.StartsWith("column ", StringComparison.Ordinal) || eq <= 0) continue;
            var key = body[..eq].Trim();
            if (pairs.ContainsKey(key)) throw new OneBodyModelError(path, (i + 1).ToString(Inv), key, $"given twice (first on line {lineOf[key]})");
            pairs[key] = body[(eq + 3)..].TrimEnd('\r');
            lineOf[key] = i + 1;
        }
        var header = OneBodyHeaderText.FromPairs(pairs, path, k => lineOf.TryGetValue(k, out var l) ? l.ToString(Inv) : "");
        var cols = Columns(header.Unit);
        if (i >= lines.Length) throw new OneBodyModelError(path, (i + 1).ToString(Inv), "columns", "the file ends before the column names");
        var names = lines[i].TrimEnd('\r').Split(',');
        for (int c = 0; c < cols.Count; c++)
            if (c >= names.Length || names[c] != cols[c].Name)
                throw new OneBodyModelError(path, (i + 1).ToString(Inv), cols[c].Name, $"column {c + 1} must be '{cols[c].Name}', found '{(c < names.Length ? names[c] : "")}'");
        if (names.Length != cols.Count) throw new OneBodyModelError(path, (i + 1).ToString(Inv), names[^1], $"expected {cols.Count} columns, found {names.Length}");
        var elements = new List<OneBodyElement>();
        var displacements = new List<Vec3>();
        var reader = new ElementReader(path, header, cols);
        for (i++; i < lines.Length; i++)
        {
            var line = lines[i].TrimEnd('\r');
            if (line.Length == 0) continue;
            var where = (i + 1).ToString(Inv);
            var cells = line.Split(',');
            if (cells.Length != cols.Count) throw new OneBodyModelError(path, where, "row", $"expected {cols.Count} values, found {cells.Length}");
            var (e, d) = reader.Read(cells, where);
            elements.Add(e); displacements.Add(d);
        }
        var model = new OneBodyModel(header, elements);
        return new ExportedModel(model.Bind(path, text, displacements), header);
    }

    /// <summary>Parses the text cells of one element (CSV cells or Parquet values turned into text).</summary>
    private sealed class ElementReader(string path, OneBodyHeader header, IReadOnlyList<TableColumn> cols)
    {
        private readonly Dictionary<string, int> _orbitals = header.Orbitals.Select((o, i) => (o.Label, i)).ToDictionary(x => x.Label, x => x.i);
        private readonly Dictionary<string, int> _flavours = header.Flavours.Select((f, i) => (f, i)).ToDictionary(x => x.f, x => x.i);

        public (OneBodyElement, Vec3) Read(IReadOnlyList<string> v, string where)
        {
            int Int(int c) => int.TryParse(v[c], NumberStyles.AllowLeadingSign, Inv, out var n) ? n
                : throw new OneBodyModelError(path, where, cols[c].Name, $"'{v[c]}' is not a whole number");
            double Num(int c) => double.TryParse(v[c], NumberStyles.Float, Inv, out var x) && double.IsFinite(x) ? x
                : throw new OneBodyModelError(path, where, cols[c].Name, $"'{v[c]}' is not a finite number");
            int Name(int c, Dictionary<string, int> known, string what) => known.TryGetValue(v[c], out var k) ? k
                : throw new OneBodyModelError(path, where, cols[c].Name, $"unknown {what} '{v[c]}'" + Models.NameSuggestion.Format(Models.NameSuggestion.Closest(v[c], known.Keys)));
            var e = new OneBodyElement((Int(0), Int(1), Int(2)), Name(3, _orbitals, "orbital"), Name(4, _flavours, "flavour"),
                                       Name(5, _orbitals, "orbital"), Name(6, _flavours, "flavour"), new Complex(Num(7), Num(8)), where);
            return (e, new Vec3(Num(9), Num(10), Num(11)));
        }
    }

    // ---------- Parquet ----------

    private static ParquetSchema Schema(IReadOnlyList<TableColumn> cols) => new(
        new DataField<int>(cols[0].Name), new DataField<int>(cols[1].Name), new DataField<int>(cols[2].Name),
        new DataField<string>(cols[3].Name), new DataField<string>(cols[4].Name), new DataField<string>(cols[5].Name), new DataField<string>(cols[6].Name),
        new DataField<double>(cols[7].Name), new DataField<double>(cols[8].Name),
        new DataField<double>(cols[9].Name), new DataField<double>(cols[10].Name), new DataField<double>(cols[11].Name));

    private static async Task WriteParquet(OneBodyModel model, Stream stream)
    {
        var h = model.Header;
        var cols = Columns(h.Unit);
        var schema = Schema(cols);
        var el = model.Elements;
        int n = el.Count;
        var ints = new int[3][]; var texts = new string[4][]; var nums = new double[5][];
        for (int c = 0; c < 3; c++) ints[c] = new int[n];
        for (int c = 0; c < 4; c++) texts[c] = new string[n];
        for (int c = 0; c < 5; c++) nums[c] = new double[n];
        for (int r = 0; r < n; r++)
        {
            var e = el[r];
            var d = Displacement(h, e);
            ints[0][r] = e.Cell.N1; ints[1][r] = e.Cell.N2; ints[2][r] = e.Cell.N3;
            texts[0][r] = h.Orbitals[e.From].Label; texts[1][r] = h.Flavours[e.FromFlavour];
            texts[2][r] = h.Orbitals[e.To].Label; texts[3][r] = h.Flavours[e.ToFlavour];
            nums[0][r] = e.Amplitude.Real; nums[1][r] = e.Amplitude.Imaginary; nums[2][r] = d.X; nums[3][r] = d.Y; nums[4][r] = d.Z;
        }
        var meta = new Dictionary<string, string>();
        foreach (var (k, v) in OneBodyHeaderText.ToPairs(h)) meta[k] = v;
        TableColumn.AddUnits(meta, cols);
        await using var writer = await ParquetWriter.CreateAsync(schema, stream);
        writer.CustomMetadata = meta;
        using var rg = writer.CreateRowGroup();
        var f = schema.DataFields;
        for (int c = 0; c < 3; c++) await rg.WriteAsync<int>(f[c], ints[c], null, cols[c].Metadata());
        for (int c = 0; c < 4; c++) await rg.WriteAsync(f[3 + c], texts[c]); // Parquet.Net 6 takes column metadata for value types only
        for (int c = 0; c < 5; c++) await rg.WriteAsync<double>(f[7 + c], nums[c], null, cols[7 + c].Metadata());
    }

    private static async Task<ExportedModel> ReadParquet(string path, byte[] bytes)
    {
        ParquetReader reader;
        try { reader = await ParquetReader.CreateAsync(new MemoryStream(bytes)); }
        catch (Exception e) when (e is IOException or InvalidDataException or NotSupportedException)
        { throw new OneBodyModelError(path, "", "file", $"not a readable Parquet file ({e.Message})"); }
        await using (reader)
        {
            var meta = reader.CustomMetadata ?? new Dictionary<string, string>();
            var header = OneBodyHeaderText.FromPairs(meta.ToDictionary(kv => kv.Key, kv => kv.Value), path, _ => "");
            var cols = Columns(header.Unit);
            var fields = reader.Schema.DataFields;
            var expected = Schema(cols).DataFields;
            for (int c = 0; c < cols.Count; c++)
                if (c >= fields.Length || fields[c].Name != cols[c].Name || fields[c].ClrType != expected[c].ClrType)
                    throw new OneBodyModelError(path, "", cols[c].Name, $"column {c + 1} must be '{cols[c].Name}' of {expected[c].ClrType.Name.ToLowerInvariant()} values, found '{(c < fields.Length ? fields[c].Name : "")}'");
            var elements = new List<OneBodyElement>();
            var displacements = new List<Vec3>();
            var er = new ElementReader(path, header, cols);
            long row = 0;
            for (int g = 0; g < reader.RowGroupCount; g++)
            {
                using var rg = reader.OpenRowGroupReader(g);
                int n = (int)rg.RowCount;
                var values = new string?[cols.Count][];
                for (int c = 0; c < cols.Count; c++)
                {
                    values[c] = new string?[n];
                    if (expected[c].ClrType == typeof(int)) { var b = new int[n]; await rg.ReadAsync<int>(fields[c], b); for (int r = 0; r < n; r++) values[c][r] = b[r].ToString(Inv); }
                    else if (expected[c].ClrType == typeof(double)) { var b = new double[n]; await rg.ReadAsync<double>(fields[c], b); for (int r = 0; r < n; r++) values[c][r] = R(b[r]); }
                    else { var b = new string?[n]; await rg.ReadAsync(fields[c], b.AsMemory()); values[c] = b; }
                }
                for (int r = 0; r < n; r++, row++)
                {
                    var cells = new string[cols.Count];
                    for (int c = 0; c < cols.Count; c++) cells[c] = values[c][r] ?? "";
                    var (e, d) = er.Read(cells, $"row {row + 1}");
                    elements.Add(e); displacements.Add(d);
                }
            }
            var model = new OneBodyModel(header, elements);
            // The model hash of results made from a binary file covers its bytes (hex text).
            return new ExportedModel(model.Bind(path, Convert.ToHexString(bytes), displacements), header);
        }
    }

    // ---------- JSON ----------

    /// <summary>The JSON text: header fields (structured lattice and basis) and the `elements` list, one object per row.</summary>
    public static string ToJson(OneBodyModel model)
    {
        var h = model.Header;
        string u = h.Unit.Symbol();
        static JsonArray Vec(Vec3 v) => [v.X, v.Y, v.Z];
        var root = new JsonObject();
        foreach (var (key, value) in OneBodyHeaderText.ToPairs(h))
        {
            if (key.StartsWith("site_", StringComparison.Ordinal) || key.StartsWith("orbital_", StringComparison.Ordinal)
                || key.StartsWith("lattice_", StringComparison.Ordinal) || key == "flavours") continue;
            root[key] = key is "renormalized" or "phase_includes_site_positions" ? value == "true"
                : key == "sampling_mesh" ? int.Parse(value, Inv)
                : key == "sampling_shifted" ? value == "true"
                : double.TryParse(value, NumberStyles.Float, Inv, out var x) && key != "model" && key != "tool_version" ? x : value;
        }
        root["lattice"] = new JsonObject
        {
            ["kind"] = OneBodyHeaderText.LatticeName(h.Lattice.Kind), ["dimension"] = h.Lattice.Dimension,
            ["constant_angstrom"] = h.Lattice.Constant,
            ["vectors_angstrom"] = new JsonArray(Vec(h.Lattice.A1), Vec(h.Lattice.A2), Vec(h.Lattice.A3)),
        };
        root["flavours"] = new JsonArray([.. h.Flavours.Select(f => (JsonNode)f)]);
        root["sites"] = new JsonArray([.. h.Sites.Select(s => (JsonNode)new JsonObject { ["name"] = s.Name, ["position_angstrom"] = Vec(s.Position) })]);
        root["orbitals"] = new JsonArray([.. h.Orbitals.Select(o => (JsonNode)new JsonObject
        {
            ["label"] = o.Label, ["site"] = h.Sites[o.Site].Name, ["kind"] = o.Kind == Binding.OrbitalKind.Correlated ? "correlated" : "conduction",
        })]);
        var cols = Columns(h.Unit);
        root["columns"] = new JsonArray([.. cols.Select(c => (JsonNode)new JsonObject { ["name"] = c.Name, ["unit"] = c.Unit, ["description"] = c.Description })]);
        var elements = new JsonArray();
        foreach (var e in model.Elements)
        {
            var d = Displacement(h, e);
            elements.Add(new JsonObject
            {
                ["cell_a1"] = e.Cell.N1, ["cell_a2"] = e.Cell.N2, ["cell_a3"] = e.Cell.N3,
                ["from_orbital"] = h.Orbitals[e.From].Label, ["from_flavour"] = h.Flavours[e.FromFlavour],
                ["to_orbital"] = h.Orbitals[e.To].Label, ["to_flavour"] = h.Flavours[e.ToFlavour],
                [$"amplitude_real_{u}"] = e.Amplitude.Real, [$"amplitude_imag_{u}"] = e.Amplitude.Imaginary,
                ["displacement_x_angstrom"] = d.X, ["displacement_y_angstrom"] = d.Y, ["displacement_z_angstrom"] = d.Z,
            });
        }
        root["elements"] = elements;
        return root.ToJsonString(new JsonSerializerOptions { WriteIndented = true }) + "\n";
    }

    private static ExportedModel ReadJson(string path, string text)
    {
        JsonNode? root;
        try { root = JsonNode.Parse(text); }
        catch (JsonException e) { throw new OneBodyModelError(path, ((e.LineNumber ?? 0) + 1).ToString(Inv), "json", $"not valid JSON ({e.Message})"); }
        if (root is not JsonObject obj) throw new OneBodyModelError(path, "", "json", "the top level is not an object");
        string Scalar(JsonNode? n, string field) => n is JsonValue v
            ? v.TryGetValue<string>(out var s) ? s : v.TryGetValue<bool>(out var b) ? (b ? "true" : "false") : v.ToJsonString()
            : throw new OneBodyModelError(path, "", field, "expected a single value");
        string Vector(JsonNode? n, string field) => n is JsonArray a && a.Count == 3
            ? string.Join(" ", a.Select((x, i) => Scalar(x, $"{field}[{i}]")))
            : throw new OneBodyModelError(path, "", field, "expected [x, y, z]");
        JsonArray Array(string field) => obj[field] as JsonArray ?? throw new OneBodyModelError(path, "", field, "missing or not a list");
        var pairs = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (key, value) in obj)
            if (value is JsonValue) pairs[key] = Scalar(value, key);
        if (obj["lattice"] is JsonObject lat)
        {
            if (lat["kind"] is { } k) pairs["lattice_kind"] = Scalar(k, "lattice.kind");
            if (lat["dimension"] is { } d) pairs["lattice_dimension"] = Scalar(d, "lattice.dimension");
            if (lat["constant_angstrom"] is { } c) pairs["lattice_constant_angstrom"] = Scalar(c, "lattice.constant_angstrom");
            if (lat["vectors_angstrom"] is JsonArray vs && vs.Count == 3)
                for (int i = 0; i < 3; i++) pairs[$"lattice_vector_{i + 1}_angstrom"] = Vector(vs[i], $"lattice.vectors_angstrom[{i}]");
            else throw new OneBodyModelError(path, "", "lattice.vectors_angstrom", "expected three vectors [x, y, z]");
        }
        pairs["flavours"] = string.Join(" ", Array("flavours").Select((f, i) => Scalar(f, $"flavours[{i}]")));
        var sites = Array("sites");
        for (int i = 0; i < sites.Count; i++)
            pairs[$"site_{i + 1}"] = $"{Scalar(sites[i]?["name"], $"sites[{i}].name")} {Vector(sites[i]?["position_angstrom"], $"sites[{i}].position_angstrom")}";
        var orbitals = Array("orbitals");
        for (int i = 0; i < orbitals.Count; i++)
            pairs[$"orbital_{i + 1}"] = $"{Scalar(orbitals[i]?["label"], $"orbitals[{i}].label")} {Scalar(orbitals[i]?["kind"], $"orbitals[{i}].kind")}";
        var jsonField = new Dictionary<string, string>
        {
            ["lattice_kind"] = "lattice.kind", ["lattice_dimension"] = "lattice.dimension", ["lattice_constant_angstrom"] = "lattice.constant_angstrom",
            ["lattice_vector_1_angstrom"] = "lattice.vectors_angstrom[0]", ["lattice_vector_2_angstrom"] = "lattice.vectors_angstrom[1]",
            ["lattice_vector_3_angstrom"] = "lattice.vectors_angstrom[2]",
        };
        var header = OneBodyHeaderText.FromPairs(pairs, path, k => k.StartsWith("site_", StringComparison.Ordinal) ? $"sites[{int.Parse(k[5..], Inv) - 1}]"
            : k.StartsWith("orbital_", StringComparison.Ordinal) ? $"orbitals[{int.Parse(k[8..], Inv) - 1}]" : jsonField.GetValueOrDefault(k, k));
        var cols = Columns(header.Unit);
        var list = Array("elements");
        var er = new ElementReader(path, header, cols);
        var elements = new List<OneBodyElement>();
        var displacements = new List<Vec3>();
        for (int i = 0; i < list.Count; i++)
        {
            var where = $"elements[{i}]";
            if (list[i] is not JsonObject row) throw new OneBodyModelError(path, where, "element", "not an object");
            var cells = cols.Select(c => row[c.Name] is { } v ? Scalar(v, $"{where}.{c.Name}")
                : throw new OneBodyModelError(path, where, c.Name, "missing")).ToArray();
            var (e, d) = er.Read(cells, where);
            elements.Add(e); displacements.Add(d);
        }
        return new ExportedModel(new OneBodyModel(header, elements).Bind(path, text, displacements), header);
    }

    // ---------- recognition ----------

    /// <summary>
    /// Whether <paramref name="path"/> is an exported model: a .csv whose first lines carry the format tag, a .parquet
    /// whose metadata does, or a .json whose `format` is it. Unreadable files count as not exported (their own loader
    /// reports them).
    /// </summary>
    public static bool IsExportedModel(string path)
    {
        try
        {
            if (!File.Exists(path)) return false;
            var ext = Path.GetExtension(path).ToLowerInvariant();
            if (ext == ".parquet")
            {
                using var s = File.OpenRead(path);
                var r = ParquetReader.CreateAsync(s).GetAwaiter().GetResult();
                try { return r.CustomMetadata?.GetValueOrDefault("format") == OneBodyHeader.FormatTag; }
                finally { r.DisposeAsync().AsTask().GetAwaiter().GetResult(); }
            }
            if (ext is not (".csv" or ".json")) return false;
            using var reader = new StreamReader(path);
            var head = new char[4096];
            int n = reader.ReadBlock(head, 0, head.Length);
            var start = new string(head, 0, n);
            return ext == ".csv" ? start.Contains($"# format = {OneBodyHeader.FormatTag}", StringComparison.Ordinal)
                                 : JsonFormatTag().IsMatch(start);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or InvalidDataException or NotSupportedException) { return false; }
    }

    /// <summary>Reads an exported model (.json, .csv or .parquet) into a plain one-body model.</summary>
    /// <exception cref="OneBodyModelError">A damaged file: the message names the file, the line (or row, or JSON path) and the field.</exception>
    /// <exception cref="FileNotFoundException">No such file.</exception>
    public static ExportedModel Load(string path)
    {
        if (!File.Exists(path)) throw new FileNotFoundException($"{path}: exported model not found", path);
        var ext = Path.GetExtension(path).ToLowerInvariant();
        return ext switch
        {
            ".json" => ReadJson(path, File.ReadAllText(path)),
            ".csv" => ReadCsv(path, File.ReadAllText(path)),
            ".parquet" => ReadParquet(path, File.ReadAllBytes(path)).GetAwaiter().GetResult(),
            _ => throw new OneBodyModelError(path, "", "file", "an exported model is a .json, .csv or .parquet file"),
        };
    }
}
