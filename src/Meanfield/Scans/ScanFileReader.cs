using System.Globalization;
using Tomlyn.Parsing;
using Tomlyn.Syntax;

namespace Meanfield.Scans;

/// <summary>
/// Reads a scan file (TOML; format in scans/README.md). Every error names the file, the line and the field. The
/// syntax tree is walked directly so that each value keeps its line and unknown keys can be reported.
/// </summary>
public static class ScanFileReader
{
    private static readonly string[] TopKeys = ["model", "temperature"];
    private static readonly string[] Tables = ["axis", "tie", "fixed", "solver", "columns"];
    private static readonly string[] AxisKeys = ["name", "from", "to", "points", "spacing", "values", "unit", "free"];
    private static readonly string[] SolverKeys = ["mesh", "tolerance", "max_iterations", "shifted"];
    private static readonly string[] ColumnKeys = ["heat", "nodes", "dos"];

    /// <summary>Most points along one axis (a 1e4 x 1e4 map is already 1e8 solves).</summary>
    public const int MaxAxisPoints = 10_000;

    /// <summary>Highest temperature, K: the energy bound of models (1 keV, <see cref="Models.PhysicalRange"/>) over k_B.</summary>
    public static readonly double MaxKelvin = Models.PhysicalRange.MaxEnergyElectronVolts * Units.EnergyUnits.Kelvins(Units.EnergyUnit.ElectronVolt);

    /// <summary>Reads and checks a scan file.</summary>
    /// <param name="modelParameters">The model's parameter names when known: fixed and tied names are then checked
    /// against them, and an axis that is not a model parameter becomes a free variable. Without them, free variables
    /// must be marked with free = true.</param>
    public static ScanDefinition Load(string path, IReadOnlyCollection<string>? modelParameters = null)
    {
        string full = Path.GetFullPath(path);
        if (!File.Exists(full)) throw new ScanFileError(path, 0, "file", "scan file not found");
        var text = Models.Utf8Text.Read(full, out var invalid);
        if (invalid is { } bad) throw new ScanFileError(full, bad.Line, "text", $"column {bad.Column}: {bad.Problem}");
        return Parse(text, full, modelParameters);
    }

    public static ScanDefinition Parse(string text, string path, IReadOnlyCollection<string>? modelParameters = null)
    {
        var doc = SyntaxParser.Parse(text, path, true);
        foreach (var d in doc.Diagnostics)
            if (d.Kind == DiagnosticMessageKind.Error)
                throw new ScanFileError(path, d.Span.Start.Line + 1, "syntax", d.Message);
        var r = new Reader(path);

        string? modelRef = null; int modelLine = 0;
        double? temperature = null; int temperatureLine = 0;
        foreach (var kv in doc.KeyValues)
        {
            string key = Reader.KeyName(kv);
            switch (key)
            {
                case "model": modelRef = r.String(kv, key); modelLine = Reader.Line(kv); break;
                case "temperature": temperature = r.Temperature(kv); temperatureLine = Reader.Line(kv); break;
                default: throw r.Unknown(kv, key, TopKeys.Concat(Tables));
            }
        }

        var axes = new List<(ScanAxis Axis, int Line)>();
        var ties = new List<KeyValuePair<string, string>>();
        var tieLines = new Dictionary<string, int>();
        var fixedValues = new List<KeyValuePair<string, string>>();
        var fixedLines = new Dictionary<string, int>();
        var solver = new ScanSolverSettings();
        var columns = new ScanColumnRequest();
        var seenTables = new HashSet<string>();
        var lines = new Dictionary<string, int>();
        foreach (var table in doc.Tables)
        {
            string name = table.Name?.ToString().Trim() ?? "";
            int line = Reader.Line(table);
            bool isArray = table is TableArraySyntax;
            if (!Tables.Contains(name))
                throw new ScanFileError(path, line, $"[{name}]", "unknown table" + ClosestName.Hint(name, Tables));
            if (name == "axis" != isArray)
                throw new ScanFileError(path, line, $"[{name}]", name == "axis" ? "write axes as [[axis]]" : $"write [{name}], not [[{name}]]");
            if (!isArray && !seenTables.Add(name)) throw new ScanFileError(path, line, $"[{name}]", "table given twice");
            switch (name)
            {
                case "axis":
                    var axis = r.Axis(table);
                    axes.Add((axis, line));
                    lines.TryAdd("axis." + axis.Name, line);
                    break;
                case "tie":
                    foreach (var kv in table.Items)
                    {
                        string key = Reader.KeyName(kv);
                        if (tieLines.ContainsKey(key)) throw new ScanFileError(path, Reader.Line(kv), $"tie.{key}", "tied twice");
                        ties.Add(new(key, r.Expression(kv, "tie." + key)));
                        tieLines[key] = Reader.Line(kv);
                        lines["tie." + key] = Reader.Line(kv);
                    }
                    break;
                case "fixed":
                    foreach (var kv in table.Items)
                    {
                        string key = Reader.KeyName(kv);
                        if (fixedLines.ContainsKey(key)) throw new ScanFileError(path, Reader.Line(kv), $"fixed.{key}", "fixed twice");
                        fixedValues.Add(new(key, r.Expression(kv, "fixed." + key)));
                        fixedLines[key] = Reader.Line(kv);
                        lines["fixed." + key] = Reader.Line(kv);
                    }
                    break;
                case "solver": solver = r.Solver(table); break;
                case "columns": columns = r.Columns(table); break;
            }
        }

        if (modelRef is null) throw new ScanFileError(path, 1, "model", "missing: give the model file, relative to the scan file");
        string modelPath = Path.GetFullPath(Path.Combine(Path.GetDirectoryName(path) ?? ".", modelRef));
        if (!File.Exists(modelPath)) throw new ScanFileError(path, modelLine, "model", $"model file not found: {modelPath}");
        if (axes.Count == 0) throw new ScanFileError(path, 1, "axis", "no [[axis]] given");

        var names = new Dictionary<string, int>();
        foreach (var (axis, line) in axes)
        {
            if (names.TryGetValue(axis.Name, out int first))
                throw new ScanFileError(path, line, $"axis.name", $"duplicate axis '{axis.Name}' (first on line {first})");
            names[axis.Name] = line;
            if (fixedLines.TryGetValue(axis.Name, out int fl))
                throw new ScanFileError(path, fl, $"fixed.{axis.Name}", $"'{axis.Name}' is a scan axis (line {line}) and cannot be fixed");
            if (tieLines.TryGetValue(axis.Name, out int tl))
                throw new ScanFileError(path, tl, $"tie.{axis.Name}", $"'{axis.Name}' is a scan axis (line {line}) and cannot be tied");
        }
        foreach (var kv in ties)
            if (fixedLines.TryGetValue(kv.Key, out int fl))
                throw new ScanFileError(path, tieLines[kv.Key], $"tie.{kv.Key}", $"'{kv.Key}' is also fixed (line {fl})");

        var temperatureAxes = axes.Where(a => a.Axis.IsTemperature).ToList();
        if (temperatureAxes.Count > 0 && temperature is not null)
            throw new ScanFileError(path, temperatureLine, "temperature", $"temperature is also a scan axis (line {temperatureAxes[0].Line})");
        if (temperatureAxes.Count > 1)
            throw new ScanFileError(path, temperatureAxes[1].Line, "axis.name", "only one axis may scan the temperature (T or temperature)");
        if (temperatureAxes.Count == 0 && temperature is null)
            throw new ScanFileError(path, 1, "temperature", "missing: give temperature = \"2 K\" or an axis named T");

        var usedByTies = new HashSet<string>(ties.SelectMany(t => TieSubstitution.Identifiers(t.Value)));
        var resolved = new List<ScanAxis>();
        foreach (var (axis, line) in axes)
        {
            var a = axis;
            if (!a.IsTemperature && modelParameters is not null && !modelParameters.Contains(a.Name)) a = a with { IsFreeVariable = true };
            if (a.IsFreeVariable && !usedByTies.Contains(a.Name))
                throw new ScanFileError(path, line, "axis.name",
                    $"'{a.Name}' is not a model parameter and no [tie] uses it" +
                    (modelParameters is null ? "" : ClosestName.Hint(a.Name, modelParameters)));
            resolved.Add(a);
        }
        if (modelParameters is not null)
        {
            foreach (var kv in fixedValues.Concat(ties))
                if (!modelParameters.Contains(kv.Key))
                {
                    int line = fixedLines.TryGetValue(kv.Key, out int l) ? l : tieLines[kv.Key];
                    throw new ScanFileError(path, line, kv.Key, "not a parameter of the model" + ClosestName.Hint(kv.Key, modelParameters));
                }
            var free = resolved.Where(a => a.IsFreeVariable).Select(a => a.Name).ToList();
            foreach (var kv in fixedValues) CheckExpression(path, fixedLines[kv.Key], "fixed." + kv.Key, kv.Value, modelParameters);
            foreach (var kv in ties) CheckExpression(path, tieLines[kv.Key], "tie." + kv.Key, kv.Value, [.. modelParameters, .. free]);
        }

        return new ScanDefinition
        {
            SourcePath = path, SourceText = text, ModelPath = modelPath, ModelText = File.ReadAllText(modelPath),
            Axes = resolved, Ties = ties, Fixed = fixedValues, TemperatureK = temperature, Solver = solver, Columns = columns,
            Lines = lines,
        };
    }

    /// <summary>
    /// A fixed value or tie must parse and use only known names, at load time: such an error would otherwise fail at
    /// every point, far from the line that causes it.
    /// </summary>
    private static void CheckExpression(string path, int line, string field, string text, IReadOnlyCollection<string> known)
    {
        Models.Expression tree;
        try { tree = Models.ExpressionParser.Parse(text); }
        catch (Models.ExpressionException e)
        {
            throw new ScanFileError(path, line, field, $"cannot read expression \"{text}\" (at character {e.Offset + 1}): {e.Problem}");
        }
        foreach (var (name, _) in tree.Names())
            if (!known.Contains(name))
                throw new ScanFileError(path, line, field, $"\"{text}\" uses '{name}', which is neither a model parameter nor a free axis" + ClosestName.Hint(name, known));
    }

    /// <summary>Value readers that turn a wrong type into a <see cref="ScanFileError"/> at the value's line.</summary>
    private sealed class Reader(string path)
    {
        public static int Line(SyntaxNode node) => node.Span.Start.Line + 1;

        public static string KeyName(KeyValueSyntax kv) => kv.Key?.ToString().Trim().Trim('"') ?? "";

        public ScanFileError Error(SyntaxNode node, string field, string problem) => new(path, Line(node), field, problem);

        public ScanFileError Unknown(KeyValueSyntax kv, string key, IEnumerable<string> valid) =>
            Error(kv, key, "unknown key" + ClosestName.Hint(key, valid));

        public string String(KeyValueSyntax kv, string field) =>
            kv.Value is StringValueSyntax s ? s.Value ?? "" : throw Error(kv, field, "expected a string");

        public double Number(KeyValueSyntax kv, string field) => kv.Value switch
        {
            IntegerValueSyntax i => i.Value,
            FloatValueSyntax f => f.Value,
            _ => throw Error(kv, field, "expected a number"),
        };

        public int Integer(KeyValueSyntax kv, string field) =>
            kv.Value is IntegerValueSyntax i && i.Value is >= int.MinValue and <= int.MaxValue
                ? (int)i.Value : throw Error(kv, field, "expected an integer");

        public bool Boolean(KeyValueSyntax kv, string field) =>
            kv.Value is BooleanValueSyntax b ? b.Value : throw Error(kv, field, "expected true or false");

        /// <summary>A number, or a string holding an expression over parameters and free variables.</summary>
        public string Expression(KeyValueSyntax kv, string field) => kv.Value switch
        {
            StringValueSyntax s when !string.IsNullOrWhiteSpace(s.Value) => s.Value!.Trim(),
            IntegerValueSyntax or FloatValueSyntax => Number(kv, field).ToString("R", CultureInfo.InvariantCulture),
            _ => throw Error(kv, field, "expected a number or an expression string"),
        };

        public double Temperature(KeyValueSyntax kv)
        {
            double t;
            if (kv.Value is StringValueSyntax s)
            {
                if (!TemperatureText.TryParseKelvin(s.Value ?? "", out t, out string error)) throw Error(kv, "temperature", error);
            }
            else throw Error(kv, "temperature", $"give the unit as text, for example temperature = \"{Number(kv, "temperature").ToString(CultureInfo.InvariantCulture)} K\" (a scan file is not tied to one model's energy unit)");
            if (!(t >= 0) || double.IsInfinity(t)) throw Error(kv, "temperature", "must be a finite temperature >= 0");
            if (t > MaxKelvin) throw Error(kv, "temperature", $"{t:G6} K is beyond the physical range (at most {MaxKelvin:G3} K, 1 keV)");
            return t;
        }

        public ScanAxis Axis(TableSyntaxBase table)
        {
            string? name = null, spacing = null, unit = null;
            double? from = null, to = null;
            int? points = null;
            double[]? values = null;
            bool free = false;
            KeyValueSyntax? pointsKv = null, spacingKv = null, unitKv = null, valuesKv = null;
            foreach (var kv in table.Items)
            {
                string key = KeyName(kv);
                string field = "axis." + key;
                switch (key)
                {
                    case "name": name = String(kv, field); break;
                    case "from": from = Number(kv, field); break;
                    case "to": to = Number(kv, field); break;
                    case "points": points = Integer(kv, field); pointsKv = kv; break;
                    case "spacing": spacing = String(kv, field); spacingKv = kv; break;
                    case "unit": unit = String(kv, field); unitKv = kv; break;
                    case "free": free = Boolean(kv, field); break;
                    case "values":
                        valuesKv = kv;
                        if (kv.Value is not ArraySyntax arr) throw Error(kv, field, "expected an array of numbers");
                        values = arr.Items.Select(item => item.Value switch
                        {
                            IntegerValueSyntax i => (double)i.Value,
                            FloatValueSyntax f => f.Value,
                            _ => throw Error(kv, field, "expected an array of numbers"),
                        }).ToArray();
                        break;
                    default: throw Error(kv, "axis." + key, "unknown key" + ClosestName.Hint(key, AxisKeys));
                }
            }
            if (string.IsNullOrWhiteSpace(name)) throw Error(table, "axis.name", "every [[axis]] needs a name");
            bool isT = ScanAxis.IsTemperatureName(name);
            double kelvinPerUnit = isT ? 1 : 0;
            if (unit is not null)
            {
                if (!isT) throw Error(unitKv!, "axis.unit", "only a temperature axis (T) takes a unit");
                if (!TemperatureText.KelvinPerUnit(unit, out kelvinPerUnit)) throw Error(unitKv!, "axis.unit", $"unknown unit '{unit}' (use K, meV or eV)");
            }
            if (isT && free) throw Error(table, "axis.free", "the temperature axis is not a free variable");
            if (isT && unit is null) throw Error(table, "axis.unit", "a temperature axis states the unit of its values: unit = \"K\" (or \"meV\", \"eV\"); a scan file is not tied to one model's energy unit");

            if (values is not null)
            {
                if (from is not null || to is not null || points is not null || spacing is not null)
                    throw Error(valuesKv!, "axis.values", "give either values or from/to/points, not both");
                if (values.Length == 0) throw Error(valuesKv!, "axis.values", "zero points: the list is empty");
                if (values.Any(v => !double.IsFinite(v))) throw Error(valuesKv!, "axis.values", "values must be finite");
                if (values.Distinct().Count() != values.Length) throw Error(valuesKv!, "axis.values", "values repeat");
                CheckTemperature(isT, values, valuesKv!, kelvinPerUnit);
                return new ScanAxis(name, values, AxisSpacing.Explicit, free, kelvinPerUnit, isT ? unit ?? "K" : "");
            }
            if (from is null || to is null || points is null)
                throw Error(table, "axis." + (from is null ? "from" : to is null ? "to" : "points"),
                            $"axis '{name}' needs from, to and points (or values = [...])");
            if (points < 1) throw Error(pointsKv!, "axis.points", $"zero points: points = {points} must be at least 1");
            if (points > MaxAxisPoints) throw Error(pointsKv!, "axis.points", $"points = {points} is more than {MaxAxisPoints} along one axis");
            if (points > 1 && from == to) throw Error(table, "axis.to", "from equals to with more than one point");
            var kind = (spacing ?? "linear") switch
            {
                "linear" => AxisSpacing.Linear,
                "log" => AxisSpacing.Log,
                _ => throw Error(spacingKv!, "axis.spacing", $"'{spacing}' is not a spacing" + ClosestName.Hint(spacing!, ["linear", "log"])),
            };
            if (kind == AxisSpacing.Log && (from <= 0 || to <= 0))
                throw Error(spacingKv!, "axis.spacing", $"log spacing needs positive bounds (from = {from}, to = {to})");
            var grid = kind == AxisSpacing.Log
                ? ScanAxis.Logarithmic(from.Value, to.Value, points.Value)
                : ScanAxis.Linear(from.Value, to.Value, points.Value);
            CheckTemperature(isT, grid, table, kelvinPerUnit);
            return new ScanAxis(name, grid, kind, free, kelvinPerUnit, isT ? unit ?? "K" : "");
        }

        private void CheckTemperature(bool isT, double[] values, SyntaxNode node, double unitKelvin)
        {
            if (isT && values.Any(v => v < 0)) throw Error(node, "axis.values", "temperatures must be >= 0");
            if (isT && values.Any(v => v * (unitKelvin > 0 ? unitKelvin : 1) > MaxKelvin))
                throw Error(node, "axis.values", $"temperatures beyond {MaxKelvin:G3} K (1 keV) are outside the physical range");
        }

        public ScanSolverSettings Solver(TableSyntaxBase table)
        {
            var s = new ScanSolverSettings();
            foreach (var kv in table.Items)
            {
                string key = KeyName(kv), field = "solver." + key;
                s = key switch
                {
                    "mesh" => s with { Mesh = InRange(kv, field, Integer(kv, field), Models.PhysicalRange.MinMesh, Models.PhysicalRange.MaxMesh) },
                    "tolerance" => s with { Tolerance = Number(kv, field) is > 0 and var t && double.IsFinite(t) ? t : throw Error(kv, field, "must be a finite number > 0") },
                    "max_iterations" => s with { MaxIterations = InRange(kv, field, Integer(kv, field), 1, Models.PhysicalRange.MaxIterations) },
                    "shifted" => s with { Shifted = Boolean(kv, field) },
                    _ => throw Error(kv, field, "unknown key" + ClosestName.Hint(key, SolverKeys)),
                };
            }
            return s;
        }

        private int InRange(KeyValueSyntax kv, string field, int v, int lo, int hi) =>
            v >= lo && v <= hi ? v : throw Error(kv, field, $"{v} is outside {lo}..{hi}");

        public ScanColumnRequest Columns(TableSyntaxBase table)
        {
            var c = new ScanColumnRequest();
            foreach (var kv in table.Items)
            {
                string key = KeyName(kv), field = "columns." + key;
                c = key switch
                {
                    "heat" => c with { Heat = Boolean(kv, field) },
                    "nodes" => c with { Nodes = Boolean(kv, field) },
                    "dos" => c with { Dos = Boolean(kv, field) },
                    _ => throw Error(kv, field, "unknown key" + ClosestName.Hint(key, ColumnKeys)),
                };
            }
            return c;
        }
    }
}
