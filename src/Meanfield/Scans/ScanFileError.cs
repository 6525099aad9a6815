namespace Meanfield.Scans;

/// <summary>An error in a scan file, naming the file, the 1-based line and the field.</summary>
public sealed class ScanFileError(string file, int line, string field, string problem)
    : ScanError($"{file}:{(line > 0 ? line.ToString(System.Globalization.CultureInfo.InvariantCulture) : "?")}: {field}: {problem}")
{
    public string File { get; } = file;
    /// <summary>1-based line number, 0 when unknown.</summary>
    public int Line { get; } = line;
    public string Field { get; } = field;
    public string Problem { get; } = problem;
}
