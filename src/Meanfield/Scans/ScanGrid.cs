using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace Meanfield.Scans;

/// <summary>
/// The Cartesian product of the scan axes. Point ids are row-major flat indices (last axis fastest); the visit order
/// is a boustrophedon (reflected mixed-radix Gray code), so consecutive visits differ by one step along one axis and
/// every point but the first has a solved neighbour to warm-start from.
/// </summary>
public sealed class ScanGrid
{
    private readonly int[] _sizes;
    private readonly int[] _strides;

    public IReadOnlyList<ScanAxis> Axes { get; }
    /// <summary>Fixed parameter overrides (name to expression), applied before axes and ties.</summary>
    public IReadOnlyList<KeyValuePair<string, string>> Fixed { get; }
    /// <summary>Tied parameters (name to expression over parameters and free variables), applied last, in order.</summary>
    public IReadOnlyList<KeyValuePair<string, string>> Ties { get; }
    /// <summary>Temperature in K when no axis scans it.</summary>
    public double? FixedTemperatureK { get; }
    public int Count { get; }

    /// <summary>The grid of <paramref name="axes"/> (the first runs slowest) with fixed overrides, ties and a fixed temperature.</summary>
    /// <exception cref="ArgumentException">No axis, or an axis without points (the scan reader refuses both first).</exception>
    /// <exception cref="RequestError">More than 2^31 points in all.</exception>
    public ScanGrid(IReadOnlyList<ScanAxis> axes, IReadOnlyList<KeyValuePair<string, string>>? fixedOverrides = null,
                    IReadOnlyList<KeyValuePair<string, string>>? ties = null, double? temperatureK = null)
    {
        if (axes.Count == 0) throw new ArgumentException("a scan needs at least one axis", nameof(axes));
        Axes = axes;
        Fixed = fixedOverrides ?? [];
        Ties = ties ?? [];
        FixedTemperatureK = temperatureK;
        _sizes = axes.Select(a => a.Count).ToArray();
        if (_sizes.Any(s => s < 1)) throw new ArgumentException("every axis needs at least one point", nameof(axes));
        _strides = new int[_sizes.Length];
        long count = 1;
        for (int d = _sizes.Length - 1; d >= 0; d--)
        {
            _strides[d] = (int)count;
            count *= _sizes[d];
            if (count > int.MaxValue) throw new RequestError($"scan grid of {string.Join(" x ", _sizes)} points: more than 2^31 points; use fewer points per axis");
        }
        Count = (int)count;
    }

    public int Dimensions => _sizes.Length;

    public int PointId(ReadOnlySpan<int> index)
    {
        int id = 0;
        for (int d = 0; d < _sizes.Length; d++)
        {
            if ((uint)index[d] >= (uint)_sizes[d]) throw new ArgumentOutOfRangeException(nameof(index));
            id += index[d] * _strides[d];
        }
        return id;
    }

    public int[] IndexOf(int id)
    {
        if ((uint)id >= (uint)Count) throw new ArgumentOutOfRangeException(nameof(id));
        var index = new int[_sizes.Length];
        for (int d = 0; d < _sizes.Length; d++) { index[d] = id / _strides[d]; id %= _strides[d]; }
        return index;
    }

    /// <summary>Point id visited at position <paramref name="step"/> of the snake order.</summary>
    public int SnakeId(int step)
    {
        var digits = IndexOf(step);
        // Reflected Gray code: digit d runs backwards when the counter formed by the higher digits is odd.
        long prefix = 0;
        var index = new int[_sizes.Length];
        for (int d = 0; d < _sizes.Length; d++)
        {
            index[d] = (prefix & 1) == 0 ? digits[d] : _sizes[d] - 1 - digits[d];
            prefix = prefix * _sizes[d] + digits[d];
        }
        return PointId(index);
    }

    /// <summary>All point ids in visit order.</summary>
    public IEnumerable<int> SnakeOrder()
    {
        for (int s = 0; s < Count; s++) yield return SnakeId(s);
    }

    /// <summary>
    /// Ids of shard <paramref name="shard"/> of <paramref name="shards"/> in visit order: a contiguous run of the snake,
    /// so that the warm-start chain breaks only once per shard. Shards are disjoint and cover the grid.
    /// </summary>
    public IReadOnlyList<int> Shard(int shard, int shards)
    {
        if (shards < 1 || shard < 0 || shard >= shards)
            throw new ArgumentOutOfRangeException(nameof(shard), $"shard {shard}/{shards} is out of range");
        int start = (int)((long)Count * shard / shards), end = (int)((long)Count * (shard + 1) / shards);
        var ids = new int[end - start];
        for (int s = start; s < end; s++) ids[s - start] = SnakeId(s);
        return ids;
    }

    public IReadOnlyList<int> Shard(ShardSpec spec) => Shard(spec.Index, spec.Count);

    /// <summary>The point with the given id, with its overrides resolved to expression strings.</summary>
    public ScanPoint Point(int id)
    {
        var index = IndexOf(id);
        var values = new double[_sizes.Length];
        var freeVars = new Dictionary<string, double>();
        var overrides = new List<KeyValuePair<string, string>>(Fixed);
        double? temperature = FixedTemperatureK;
        for (int d = 0; d < values.Length; d++)
        {
            var axis = Axes[d];
            values[d] = axis.Values[index[d]];
            if (axis.IsTemperature) temperature = values[d] * axis.KelvinPerUnit;
            else if (axis.IsFreeVariable) freeVars[axis.Name] = values[d];
            else Set(overrides, axis.Name, values[d].ToString("R", CultureInfo.InvariantCulture));
        }
        foreach (var tie in Ties) Set(overrides, tie.Key, TieSubstitution.Substitute(tie.Value, freeVars));
        return new ScanPoint(id, index, Axes.Select(a => a.Name).ToArray(), values, overrides, temperature ?? double.NaN);
    }

    private static void Set(List<KeyValuePair<string, string>> list, string name, string value)
    {
        int i = list.FindIndex(kv => kv.Key == name);
        if (i >= 0) list.RemoveAt(i);
        list.Add(new(name, value));
    }

    /// <summary>JSON description of the grid (stored in every output file so a merge can check completeness).</summary>
    public string ToJson()
    {
        var axes = new JsonArray();
        foreach (var a in Axes)
            axes.Add(new JsonObject
            {
                ["name"] = a.Name, ["spacing"] = a.Spacing.ToString().ToLowerInvariant(), ["free"] = a.IsFreeVariable,
                ["kelvin_per_unit"] = a.KelvinPerUnit, ["unit"] = a.Unit,
                ["values"] = new JsonArray(a.Values.Select(v => (JsonNode)JsonValue.Create(v)).ToArray()),
            });
        var root = new JsonObject { ["points"] = Count, ["order"] = "row-major, last axis fastest", ["axes"] = axes };
        if (FixedTemperatureK is double t) root["temperature_K"] = t;
        root["fixed"] = ToJson(Fixed);
        root["ties"] = ToJson(Ties);
        return root.ToJsonString();
    }

    private static JsonObject ToJson(IEnumerable<KeyValuePair<string, string>> pairs)
    {
        var o = new JsonObject();
        foreach (var kv in pairs) o[kv.Key] = kv.Value;
        return o;
    }

    public static ScanGrid FromJson(string json)
    {
        var root = JsonNode.Parse(json) ?? throw new JsonException("empty grid description");
        var axes = new List<ScanAxis>();
        foreach (var a in root["axes"]!.AsArray())
        {
            var spacing = Enum.Parse<AxisSpacing>(a!["spacing"]!.GetValue<string>(), ignoreCase: true);
            axes.Add(new ScanAxis(a["name"]!.GetValue<string>(),
                a["values"]!.AsArray().Select(v => v!.GetValue<double>()).ToArray(), spacing,
                a["free"]!.GetValue<bool>(), a["kelvin_per_unit"]!.GetValue<double>(), a["unit"]!.GetValue<string>()));
        }
        static List<KeyValuePair<string, string>> Pairs(JsonNode? n) =>
            n is JsonObject o ? o.Select(kv => new KeyValuePair<string, string>(kv.Key, kv.Value!.GetValue<string>())).ToList() : [];
        double? t = root["temperature_K"]?.GetValue<double>();
        return new ScanGrid(axes, Pairs(root["fixed"]), Pairs(root["ties"]), t);
    }

    public override string ToString() => string.Join(" x ", Axes.Select(a => a.ToString())) + $" = {Count} points";
}
