using System.Text.Json;
using System.Text.Json.Nodes;
using Parquet.Schema;

namespace Meanfield.Scans;

/// <summary>
/// The column layout of a scan's Parquet output. It depends on the model (parameter names, correlated groups) and the
/// scan (axes), so it is fixed at run start from the grid and the first result, and stored in the file metadata.
/// </summary>
public sealed class ScanSchema
{
    public IReadOnlyList<string> AxisNames { get; }
    public IReadOnlyList<string> ParameterNames { get; }
    public IReadOnlyList<string> GroupNames { get; }
    /// <summary>Whether the solver's warm-start payload is stored (chunk files, for resume); final files drop it.</summary>
    public bool IncludeSolverState { get; }
    /// <summary>Whether the text column "error" (why a point's solve threw) is present; files of older versions lack it.</summary>
    public bool IncludeErrorColumn { get; }
    public IReadOnlyList<ScanColumn> Columns { get; }
    public ParquetSchema Parquet { get; }

    public ScanSchema(IReadOnlyList<string> axisNames, IReadOnlyList<string> parameterNames,
                      IReadOnlyList<string> groupNames, bool includeSolverState = false, bool includeErrorColumn = true)
    {
        AxisNames = axisNames;
        ParameterNames = parameterNames;
        GroupNames = groupNames;
        IncludeSolverState = includeSolverState;
        IncludeErrorColumn = includeErrorColumn;
        Columns = ScanColumns.Build(this);
        var names = new HashSet<string>();
        foreach (var c in Columns)
            if (!names.Add(c.Field.Name)) throw new ArgumentException($"duplicate column '{c.Field.Name}'");
        Parquet = new ParquetSchema(Columns.Select(c => (Field)c.Field));
    }

    /// <summary>Schema for a grid whose first solved point returned <paramref name="first"/>.</summary>
    public static ScanSchema From(ScanGrid grid, ScanPoint firstPoint, ScanPointResult first, bool includeSolverState)
    {
        var parameters = ParametersOf(firstPoint, first).Select(kv => kv.Key).ToList();
        return new ScanSchema(grid.Axes.Select(a => a.Name).ToList(), parameters,
                              first.Groups.Select(g => g.Group).ToList(), includeSolverState);
    }

    /// <summary>The parameter values of a row: the solver's list, or else the numeric overrides of the point.</summary>
    public static IReadOnlyList<KeyValuePair<string, double>> ParametersOf(ScanPoint point, ScanPointResult result)
    {
        if (result.Parameters.Count > 0) return result.Parameters;
        var list = new List<KeyValuePair<string, double>>();
        foreach (var kv in point.Overrides)
            if (double.TryParse(kv.Value, System.Globalization.NumberStyles.Float,
                                System.Globalization.CultureInfo.InvariantCulture, out double v))
                list.Add(new(kv.Key, v));
        return list;
    }

    /// <summary>Throws when a row does not fit this schema (a model whose groups change between points).</summary>
    public void Check(ScanRow row)
    {
        if (row.AxisValues.Count != AxisNames.Count) throw new ScanError($"point {row.PointId}: axis count mismatch");
        if (row.Result.Groups.Count != GroupNames.Count
            || row.Result.Groups.Select(g => g.Group).Where((g, i) => g != GroupNames[i]).Any())
            throw new ScanError($"point {row.PointId}: correlated groups [{string.Join(", ", row.Result.Groups.Select(g => g.Group))}]" +
                                $" differ from the first point's [{string.Join(", ", GroupNames)}]");
    }

    public ScanSchema WithSolverState(bool include) =>
        include == IncludeSolverState ? this : new ScanSchema(AxisNames, ParameterNames, GroupNames, include, IncludeErrorColumn);

    /// <summary>The same layout with the "error" column (new files always carry it, also when resuming older chunks).</summary>
    public ScanSchema WithErrorColumn() =>
        IncludeErrorColumn ? this : new ScanSchema(AxisNames, ParameterNames, GroupNames, IncludeSolverState, true);

    /// <summary>Column name to unit, as JSON, for the file metadata.</summary>
    public string UnitsJson(string energyUnit)
    {
        var o = new JsonObject();
        foreach (var c in Columns) o[c.Field.Name] = c.Unit.Replace("{E}", energyUnit, StringComparison.Ordinal);
        return o.ToJsonString();
    }

    public string ToJson() => new JsonObject
    {
        ["axes"] = new JsonArray(AxisNames.Select(n => (JsonNode)JsonValue.Create(n)!).ToArray()),
        ["parameters"] = new JsonArray(ParameterNames.Select(n => (JsonNode)JsonValue.Create(n)!).ToArray()),
        ["groups"] = new JsonArray(GroupNames.Select(n => (JsonNode)JsonValue.Create(n)!).ToArray()),
        ["solver_state"] = IncludeSolverState,
        ["error_column"] = IncludeErrorColumn,
    }.ToJsonString();

    public static ScanSchema FromJson(string json)
    {
        var o = JsonNode.Parse(json) ?? throw new JsonException("empty schema description");
        static List<string> Names(JsonNode? n) => n!.AsArray().Select(x => x!.GetValue<string>()).ToList();
        return new ScanSchema(Names(o["axes"]), Names(o["parameters"]), Names(o["groups"]),
                              o["solver_state"]?.GetValue<bool>() ?? false, o["error_column"]?.GetValue<bool>() ?? false);
    }

    public bool SameLayout(ScanSchema other) =>
        AxisNames.SequenceEqual(other.AxisNames) && ParameterNames.SequenceEqual(other.ParameterNames)
        && GroupNames.SequenceEqual(other.GroupNames);
}
