namespace Meanfield.Models;

/// <summary>A TOML value with the place it was written (our positioned view of the Tomlyn syntax tree).</summary>
internal abstract class TomlNode(SourceLocation location)
{
    public SourceLocation Location { get; } = location;
    /// <summary>What the value is, for messages ("a string", "a table", ...).</summary>
    public abstract string Describe { get; }
}

/// <summary>A string, integer (long), float (double), boolean or date (kept as its text).</summary>
internal sealed class TomlScalar(SourceLocation location, object value, int contentOffset) : TomlNode(location)
{
    public object Value { get; } = value;
    /// <summary>Characters from the value's first character to the string content (the opening quote or quotes).</summary>
    public int ContentOffset { get; } = contentOffset;
    public bool IsDate { get; init; }

    public override string Describe => IsDate ? "a date" : Value switch
    {
        string => "a string", long => "an integer", double => "a number", bool => "a boolean", _ => "a value",
    };
}

internal sealed class TomlList(SourceLocation location, IReadOnlyList<TomlNode> items) : TomlNode(location)
{
    public IReadOnlyList<TomlNode> Items { get; } = items;
    public override string Describe => "an array";
}

internal sealed record TomlEntry(string Key, SourceLocation KeyLocation, TomlNode Value);

/// <summary>A table: a [header] block, an inline { } table or an element of a [[header]] array.</summary>
internal sealed class TomlTable(SourceLocation location) : TomlNode(location)
{
    private readonly List<TomlEntry> _entries = [];
    public IReadOnlyList<TomlEntry> Entries => _entries;
    public override string Describe => "a table";

    public TomlEntry? Find(string key)
    {
        foreach (var e in _entries) if (e.Key == key) return e;
        return null;
    }

    public void Add(TomlEntry entry) => _entries.Add(entry);
}

/// <summary>The tables of a [[header]] array in file order.</summary>
internal sealed class TomlTableArray(SourceLocation location) : TomlNode(location)
{
    public List<TomlTable> Tables { get; } = [];
    public override string Describe => "an array of tables";
}
