namespace Meanfield.Heat;

/// <summary>Bad measured heat-capacity input: names the file, the 1-based line and the column at fault.</summary>
public sealed class HeatDataError : InputException
{
    public HeatDataError(string file, int line, string column, string problem)
        : base($"{file}:{line}: column '{column}': {problem}")
    {
        File = file;
        Line = line;
        Column = column;
        Problem = problem;
    }

    public string File { get; }
    /// <summary>1-based line number in the file (0 when the whole file is at fault).</summary>
    public int Line { get; }
    public string Column { get; }
    public string Problem { get; }
}
