using System.Security.Cryptography;
using System.Text;
using System.Text.Json.Nodes;
using Meanfield.Cli;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.Cli;

/// <summary>
/// The malformed-input corpus (tests/Meanfield.Tests/Corpus/*.case, format in its README.md): every case sets up a
/// folder, runs one command in-process and must give its expected exit code and message fragments, leaving every file
/// it did not declare as written byte for byte as it was (common practice for input validation: refuse, name the
/// place, touch nothing).
/// </summary>
public class MalformedInputCorpusTests
{
    private static string CorpusFolder => Path.Combine(ModelText.RepositoryRoot(), "tests", "Meanfield.Tests", "Corpus");

    public static TheoryData<string> Cases()
    {
        var data = new TheoryData<string>();
        foreach (var f in Directory.GetFiles(CorpusFolder, "*.case").Order(StringComparer.Ordinal)) data.Add(Path.GetFileNameWithoutExtension(f));
        return data;
    }

    [Fact]
    public void The_corpus_is_there() => Assert.True(Cases().Count >= 40, $"only {Cases().Count} cases in {CorpusFolder}");

    [Theory]
    [MemberData(nameof(Cases))]
    public void Case_gives_its_exit_code_and_message_and_touches_nothing(string name)
    {
        var c = CorpusCase.Parse(File.ReadAllText(Path.Combine(CorpusFolder, name + ".case")), name);
        var dir = Directory.CreateTempSubdirectory("meanfield-corpus-").FullName;
        try
        {
            c.SetUp(dir, Path.Combine(CorpusFolder, "_base"));
            var before = Snapshot(dir);
            var (code, text) = CorpusCase.Run(c.Args.Select(a => c.Expand(a, dir)).ToArray());
            Assert.True(code == c.Exit, $"{name}: exit {code}, expected {c.Exit}; output:\n{text}");
            foreach (var fragment in c.Expect)
                Assert.True(text.Contains(c.Expand(fragment, dir), StringComparison.Ordinal), $"{name}: output lacks \"{c.Expand(fragment, dir)}\":\n{text}");
            foreach (var fragment in c.Absent)
                Assert.False(text.Contains(c.Expand(fragment, dir), StringComparison.Ordinal), $"{name}: output has \"{fragment}\":\n{text}");
            var after = Snapshot(dir);
            foreach (var (file, hash) in before)
                if (!c.MayWrite(file))
                    Assert.True(after.TryGetValue(file, out var now) && now == hash, $"{name}: {file} was changed or removed");
            foreach (var file in after.Keys)
                if (!before.ContainsKey(file))
                    Assert.True(c.MayWrite(file), $"{name}: {file} was created");
        }
        finally { try { Directory.Delete(dir, true); } catch (IOException) { } }
    }

    private static Dictionary<string, string> Snapshot(string dir) =>
        Directory.GetFiles(dir, "*", new EnumerationOptions { RecurseSubdirectories = true, AttributesToSkip = 0 })
                 .Where(f => new FileInfo(f).LinkTarget is null)
                 .ToDictionary(f => Path.GetRelativePath(dir, f), f => Convert.ToHexString(SHA256.HashData(File.ReadAllBytes(f))));
}

/// <summary>One corpus case: files, set-up steps, the command, and what it must print and leave.</summary>
internal sealed class CorpusCase
{
    public string Name { get; private init; } = "";
    public List<string> Args { get; } = [];
    public int Exit { get; private set; } = -1;
    public List<string> Expect { get; } = [];
    public List<string> Absent { get; } = [];
    private readonly List<string> _writes = [];
    private readonly List<(string Name, string? Base, string Text)> _files = [];
    private readonly List<string[]> _steps = [];

    public static CorpusCase Parse(string text, string name)
    {
        var c = new CorpusCase { Name = name };
        var lines = text.Replace("\r\n", "\n").Split('\n');
        for (int i = 0; i < lines.Length; i++)
        {
            var line = lines[i];
            if (line.StartsWith("--- ", StringComparison.Ordinal))
            {
                var head = line[4..].Trim().Split(" < ", 2);
                var body = new StringBuilder();
                while (i + 1 < lines.Length && !lines[i + 1].StartsWith("--- ", StringComparison.Ordinal) && !IsDirective(lines[i + 1]))
                    body.Append(lines[++i]).Append('\n');
                c._files.Add((head[0], head.Length > 1 ? head[1].Trim() : null, body.ToString()));
                continue;
            }
            if (line.Length == 0 || line.StartsWith('#')) continue;
            int colon = line.IndexOf(':');
            if (colon < 0) throw new FormatException($"{name}: line {i + 1}: expected 'key: value'");
            string key = line[..colon].Trim(), value = line[(colon + 1)..].Trim();
            switch (key)
            {
                case "args": c.Args.AddRange(Split(value)); break;
                case "exit": c.Exit = int.Parse(value, System.Globalization.CultureInfo.InvariantCulture); break;
                case "expect": c.Expect.Add(value); break;
                case "absent": c.Absent.Add(value); break;
                case "writes": c._writes.Add(value); break;
                case "step":
                    // json FILE PATH VALUE: VALUE is raw JSON to the end of the line (quotes kept)
                    if (value.StartsWith("json ", StringComparison.Ordinal)) c._steps.Add(value.Split(' ', 4, StringSplitOptions.RemoveEmptyEntries));
                    else c._steps.Add(Split(value));
                    break;
                default: throw new FormatException($"{name}: line {i + 1}: unknown key '{key}'");
            }
        }
        if (c.Args.Count == 0 || c.Exit < 0 || c.Expect.Count == 0) throw new FormatException($"{name}: needs args, exit and at least one expect");
        return c;
    }

    private static bool IsDirective(string line) =>
        line.Length > 0 && (line.StartsWith("args:") || line.StartsWith("exit:") || line.StartsWith("expect:") || line.StartsWith("absent:")
                            || line.StartsWith("writes:") || line.StartsWith("step:"));

    /// <summary>Space-separated words; "..." keeps spaces.</summary>
    private static string[] Split(string s)
    {
        var list = new List<string>();
        var cur = new StringBuilder();
        bool quoted = false, any = false;
        foreach (char ch in s)
        {
            if (ch == '"') { quoted = !quoted; any = true; continue; }
            if (ch == ' ' && !quoted) { if (any) list.Add(cur.ToString()); cur.Clear(); any = false; continue; }
            cur.Append(ch); any = true;
        }
        if (any) list.Add(cur.ToString());
        return [.. list];
    }

    /// <summary>"@name" is a path in the case folder; "{dir}" is the folder.</summary>
    public string Expand(string s, string dir) =>
        (s.StartsWith('@') ? Path.Combine(dir, s[1..]) : s).Replace("{dir}", dir, StringComparison.Ordinal);

    public bool MayWrite(string relative) => _writes.Any(w =>
        w.EndsWith('*') ? relative.StartsWith(w[..^1], StringComparison.Ordinal) : relative == w);

    /// <summary>Writes the files (a base file from _base/ with the block's lines as "OLD => NEW" edits) and runs the steps.</summary>
    public void SetUp(string dir, string baseFolder)
    {
        foreach (var (file, baseName, text) in _files)
        {
            byte[] bytes;
            if (baseName is null) bytes = Encoding.UTF8.GetBytes(text);
            else
            {
                bytes = File.ReadAllBytes(Path.Combine(baseFolder, baseName));
                foreach (var edit in text.Split('\n', StringSplitOptions.RemoveEmptyEntries))
                {
                    var parts = edit.Split(" => ", 2);
                    if (parts.Length != 2) throw new FormatException($"{Name}: edit '{edit}' is not 'OLD => NEW'");
                    bytes = Replace(bytes, Unescape(parts[0]), Unescape(parts[1]), edit);
                }
            }
            var path = Path.Combine(dir, file);
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
            File.WriteAllBytes(path, bytes);
        }
        foreach (var step in _steps) Step(step, dir);
    }

    private void Step(string[] s, string dir)
    {
        string P(int i) => Path.Combine(dir, s[i]);
        switch (s[0])
        {
            case "run":
                var (code, text) = Run(s.Skip(1).Select(a => Expand(a, dir)).ToArray());
                if (code != 0) throw new InvalidOperationException($"{Name}: set-up `{string.Join(" ", s.Skip(1))}` exited {code}:\n{text}");
                break;
            case "copy": Directory.CreateDirectory(Path.GetDirectoryName(P(2))!); File.Copy(P(1), P(2), true); break;
            case "truncate":
                var b = File.ReadAllBytes(P(1));
                File.WriteAllBytes(P(1), b[..Math.Min(b.Length, int.Parse(s[2], System.Globalization.CultureInfo.InvariantCulture))]);
                break;
            case "delete": if (Directory.Exists(P(1))) Directory.Delete(P(1), true); else File.Delete(P(1)); break;
            case "symlink": File.CreateSymbolicLink(P(1), s[2]); break;
            case "json":
                // json FILE a/0/b VALUE: replace one value (VALUE is JSON; "-" removes the key)
                var root = JsonNode.Parse(File.ReadAllText(P(1)))!;
                var keys = s[2].Split('/');
                JsonNode parent = root;
                foreach (var k in keys[..^1]) parent = int.TryParse(k, out int n) ? parent[n]! : parent[k]!;
                string last = keys[^1];
                if (parent is JsonArray arr) arr[int.Parse(last, System.Globalization.CultureInfo.InvariantCulture)] = JsonNode.Parse(s[3]);
                else if (s[3] == "-") ((JsonObject)parent).Remove(last);
                else parent[last] = JsonNode.Parse(s[3]);
                File.WriteAllText(P(1), root.ToJsonString());
                break;
            default: throw new FormatException($"{Name}: unknown step '{s[0]}'");
        }
    }

    public static (int Code, string Text) Run(string[] args)
    {
        using var o = new StringWriter();
        using var e = new StringWriter();
        int code = Runner.Run(CommandTree.Build(), args, o, e);
        return (code, o + "\n" + e);
    }

    // "\n" is a newline, "\xHH" a raw byte; everything else is UTF-8.
    private static byte[] Unescape(string s)
    {
        var bytes = new List<byte>();
        for (int i = 0; i < s.Length; i++)
        {
            if (s[i] == '\\' && i + 1 < s.Length && s[i + 1] == 'n') { bytes.Add((byte)'\n'); i++; }
            else if (s[i] == '\\' && i + 3 < s.Length && s[i + 1] == 'x') { bytes.Add(Convert.ToByte(s.Substring(i + 2, 2), 16)); i += 3; }
            else bytes.AddRange(Encoding.UTF8.GetBytes(s[i].ToString()));
        }
        return [.. bytes];
    }

    private byte[] Replace(byte[] text, byte[] old, byte[] replacement, string edit)
    {
        int at = text.AsSpan().IndexOf(old);
        if (at < 0) throw new FormatException($"{Name}: edit '{edit}': text not found in the base file");
        return [.. text[..at], .. replacement, .. text[(at + old.Length)..]];
    }
}
