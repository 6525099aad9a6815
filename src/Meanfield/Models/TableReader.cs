namespace Meanfield.Models;

/// <summary>
/// Typed access to one table of a model file under a fixed set of keys: unknown keys (typos) are reported with the
/// closest valid key as soon as the reader is made, and every error names the field and its line.
/// </summary>
internal sealed class TableReader
{
    private readonly TomlTable _table;
    public string Path { get; }
    public SourceLocation Location => _table.Location;

    public TableReader(TomlTable table, string path, IReadOnlyList<string> keys)
    {
        _table = table; Path = path;
        foreach (var e in table.Entries)
            if (!keys.Contains(e.Key))
                throw new ModelError(e.KeyLocation, Field(e.Key), $"unknown key '{e.Key}'", NameSuggestion.Closest(e.Key, keys));
    }

    public string Field(string key) => Path.Length == 0 ? key : $"{Path}.{key}";

    public TomlEntry? Entry(string key) => _table.Find(key);

    public bool Has(string key) => _table.Find(key) is not null;

    public ModelError Missing(string key, string what) =>
        new(Location, Field(key), $"missing {what}");

    public static ModelError WrongType(TomlNode node, string field, string expected) =>
        new(node.Location, field, $"expected {expected}, found {node.Describe}");

    public string? String(string key, bool required = false)
    {
        var e = Entry(key);
        if (e is null) return required ? throw Missing(key, "text value") : null;
        return e.Value is TomlScalar { Value: string s, IsDate: false } ? s : throw WrongType(e.Value, Field(key), "a string in quotes");
    }

    public long? Integer(string key, bool required = false)
    {
        var e = Entry(key);
        if (e is null) return required ? throw Missing(key, "integer") : null;
        return e.Value is TomlScalar { Value: long v } ? v : throw WrongType(e.Value, Field(key), "an integer");
    }

    public double? Number(string key, bool required = false)
    {
        var e = Entry(key);
        if (e is null) return required ? throw Missing(key, "number") : null;
        return AsNumber(e.Value, Field(key));
    }

    public bool? Boolean(string key)
    {
        var e = Entry(key);
        if (e is null) return null;
        return e.Value is TomlScalar { Value: bool v } ? v : throw WrongType(e.Value, Field(key), "true or false");
    }

    public ModelExpression? Expression(string key, bool required = false)
    {
        var e = Entry(key);
        if (e is null) return required ? throw Missing(key, "value (a number or an expression in quotes)") : null;
        return AsExpression(e.Value, Field(key));
    }

    public TomlList? List(string key)
    {
        var e = Entry(key);
        if (e is null) return null;
        return e.Value as TomlList ?? throw WrongType(e.Value, Field(key), "an array [...]");
    }

    public TableReader? Table(string key, IReadOnlyList<string> keys)
    {
        var e = Entry(key);
        if (e is null) return null;
        var t = e.Value as TomlTable ?? throw WrongType(e.Value, Field(key), "a table");
        return new TableReader(t, Field(key), keys);
    }

    public static double AsNumber(TomlNode node, string field) => node switch
    {
        TomlScalar { Value: long v } => v,
        TomlScalar { Value: double v } => Finite(v, node, field),
        _ => throw WrongType(node, field, "a number"),
    };

    private static double Finite(double v, TomlNode node, string field) =>
        double.IsFinite(v) ? v : throw new ModelError(node.Location, field, $"expected a finite number, found {v}");

    /// <summary>A TOML number, or a string holding an expression.</summary>
    public static ModelExpression AsExpression(TomlNode node, string field) => node switch
    {
        TomlScalar { Value: string s, IsDate: false } sc => ModelExpression.Parse(s, field, sc.Location.Shift(sc.ContentOffset)),
        TomlScalar { Value: long v } => ModelExpression.Constant(v, field, node.Location),
        TomlScalar { Value: double v } => ModelExpression.Constant(Finite(v, node, field), field, node.Location),
        _ => throw WrongType(node, field, "a number or an expression in quotes"),
    };

    /// <summary>A site's "[x, y, z]" or a lattice vector of three numbers.</summary>
    public static double[] AsNumbers(TomlNode node, string field, int count)
    {
        if (node is not TomlList list) throw WrongType(node, field, $"an array of {count} numbers");
        if (list.Items.Count != count)
            throw new ModelError(node.Location, field, $"expected {count} numbers, found {list.Items.Count}");
        var v = new double[count];
        for (int k = 0; k < count; k++) v[k] = AsNumber(list.Items[k], $"{field}[{k + 1}]");
        return v;
    }
}
