using Tomlyn.Parsing;
using Tomlyn.Syntax;

namespace Meanfield.Models;

/// <summary>
/// Reads TOML text with Tomlyn's syntax parser (which keeps line and column of every key and value) into a positioned
/// <see cref="TomlTable"/>. Syntax and TOML-semantics errors (duplicate keys, redefined tables) become ModelErrors.
/// </summary>
internal static class TomlTreeBuilder
{
    public static TomlTable Build(string text, string sourceName)
    {
        DocumentSyntax doc;
        try { doc = SyntaxParser.Parse(text, sourceName, validate: true); }
        catch (Exception e) when (e is Tomlyn.TomlException or ArgumentException or InvalidOperationException)
        {
            throw new ModelError(new SourceLocation(sourceName, null, null), "", $"TOML syntax error: {e.Message}");
        }
        if (doc.HasErrors)
        {
            foreach (var d in doc.Diagnostics)
                if (d.Kind == DiagnosticMessageKind.Error)
                {
                    var at = At(sourceName, d.Span.Start);
                    // Tomlyn reports a string left open on the line after it; point at its opening quote instead.
                    if (UnclosedString(text) is { } open && open.Line <= at.Line)
                        throw new ModelError(new SourceLocation(sourceName, open.Line, open.Column), "",
                            $"TOML syntax error: the string opened here has no closing {open.Quote} on its line");
                    throw new ModelError(at, "", $"TOML syntax error: {d.Message}");
                }
        }
        var root = new TomlTable(new SourceLocation(sourceName, 1, 1));
        foreach (var kv in doc.KeyValues) AddKeyValue(sourceName, root, kv);
        foreach (var t in doc.Tables)
        {
            var parts = KeyParts(sourceName, t.Name!);
            var parent = root;
            for (int i = 0; i < parts.Count - 1; i++) parent = Descend(sourceName, parent, parts[i]);
            var (name, where) = parts[^1];
            var header = At(sourceName, t.Span.Start);
            TomlTable current;
            if (t is TableArraySyntax)
            {
                var existing = parent.Find(name);
                TomlTableArray array;
                if (existing is null) { array = new TomlTableArray(header); parent.Add(new TomlEntry(name, where, array)); }
                else array = existing.Value as TomlTableArray
                    ?? throw new ModelError(where, name, $"[[{name}]] repeats a key that is {existing.Value.Describe} (line {existing.KeyLocation.Line})");
                current = new TomlTable(header);
                array.Tables.Add(current);
            }
            else
            {
                var existing = parent.Find(name);
                if (existing is null) { current = new TomlTable(header); parent.Add(new TomlEntry(name, where, current)); }
                else current = existing.Value as TomlTable
                    ?? throw new ModelError(where, name, $"[{name}] repeats a key that is {existing.Value.Describe} (line {existing.KeyLocation.Line})");
            }
            foreach (var kv in t.Items) AddKeyValue(sourceName, current, kv);
        }
        return root;
    }

    private static SourceLocation At(string file, TextPosition p) => new(file, p.Line + 1, p.Column + 1);

    /// <summary>
    /// The first one-line string ("..." or '...') that reaches the end of its line unclosed (TOML 1.0: basic and
    /// literal strings end on their line), skipping comments and multi-line strings; null when there is none.
    /// </summary>
    internal static (int Line, int Column, char Quote)? UnclosedString(string text)
    {
        int line = 1, column = 0;
        string? multi = null; // the delimiter of an open multi-line string
        for (int i = 0; i < text.Length; i++)
        {
            char c = text[i];
            column++;
            if (c == '\n') { line++; column = 0; continue; }
            if (multi is not null)
            {
                if (multi == "\"\"\"" && c == '\\') { i++; column++; if (i < text.Length && text[i] == '\n') { line++; column = 0; } continue; }
                if (string.CompareOrdinal(text, i, multi, 0, 3) == 0) { i += 2; column += 2; multi = null; }
                continue;
            }
            if (c == '#') { while (i + 1 < text.Length && text[i + 1] != '\n') i++; continue; }
            if (c is not ('"' or '\'')) continue;
            string triple = new(c, 3);
            if (string.CompareOrdinal(text, i, triple, 0, 3) == 0) { multi = triple; i += 2; column += 2; continue; }
            int startColumn = column;
            bool closed = false;
            for (i++; i < text.Length && text[i] != '\n'; i++)
            {
                column++;
                if (c == '"' && text[i] == '\\' && i + 1 < text.Length && text[i + 1] != '\n') { i++; column++; continue; }
                if (text[i] == c) { closed = true; break; }
            }
            if (!closed) return (line, startColumn, c);
            if (i < text.Length && text[i] == '\n') i--; // let the outer loop count the newline
        }
        return null;
    }

    private static TomlTable Descend(string file, TomlTable parent, (string Name, SourceLocation Where) part)
    {
        var e = parent.Find(part.Name);
        if (e is null)
        {
            var t = new TomlTable(part.Where);
            parent.Add(new TomlEntry(part.Name, part.Where, t));
            return t;
        }
        return e.Value switch
        {
            TomlTable t => t,
            TomlTableArray a when a.Tables.Count > 0 => a.Tables[^1],
            _ => throw new ModelError(part.Where, part.Name, $"'{part.Name}' is {e.Value.Describe}, not a table"),
        };
    }

    private static void AddKeyValue(string file, TomlTable table, KeyValueSyntax kv)
    {
        var parts = KeyParts(file, kv.Key!);
        for (int i = 0; i < parts.Count - 1; i++) table = Descend(file, table, parts[i]);
        var (name, where) = parts[^1];
        if (table.Find(name) is { } old)
            throw new ModelError(where, name, $"key '{name}' is given twice (first on line {old.KeyLocation.Line})");
        table.Add(new TomlEntry(name, where, Value(file, kv.Value!)));
    }

    private static List<(string, SourceLocation)> KeyParts(string file, KeySyntax key)
    {
        var list = new List<(string, SourceLocation)> { KeyPart(file, key.Key!) };
        foreach (var dot in key.DotKeys) list.Add(KeyPart(file, dot.Key!));
        return list;
    }

    private static (string, SourceLocation) KeyPart(string file, BareKeyOrStringValueSyntax k) => k switch
    {
        BareKeySyntax b => (b.Key!.Text!, At(file, k.Span.Start)),
        StringValueSyntax s => (s.Value!, At(file, k.Span.Start)),
        _ => ("?", At(file, k.Span.Start)),
    };

    private static TomlNode Value(string file, ValueSyntax v)
    {
        var where = At(file, v.Span.Start);
        switch (v)
        {
            case StringValueSyntax s:
                string raw = s.Token?.Text ?? "\"";
                int offset = raw.StartsWith("\"\"\"") || raw.StartsWith("'''") ? 3 : 1;
                return new TomlScalar(where, s.Value ?? "", offset);
            case IntegerValueSyntax i: return new TomlScalar(where, i.Value, 0);
            case FloatValueSyntax f: return new TomlScalar(where, f.Value, 0);
            case BooleanValueSyntax b: return new TomlScalar(where, b.Value, 0);
            case ArraySyntax a:
                var items = new List<TomlNode>();
                foreach (var item in a.Items) items.Add(Value(file, item.Value!));
                return new TomlList(where, items);
            case InlineTableSyntax t:
                var table = new TomlTable(where);
                foreach (var item in t.Items) AddKeyValue(file, table, item.KeyValue!);
                return table;
            default:
                return new TomlScalar(where, v.ToString() ?? "", 0) { IsDate = true };
        }
    }
}
