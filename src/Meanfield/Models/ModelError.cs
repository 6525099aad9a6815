namespace Meanfield.Models;

/// <summary>
/// Any problem with a model file or an override: the message reads "file:line:col: field: what is wrong (did you
/// mean 'x'?)". Loading and binding throw nothing else for bad input.
/// </summary>
public sealed class ModelError : InputException
{
    public string File { get; }
    public int? Line { get; }
    public int? Column { get; }
    /// <summary>Dotted path of the offending entry, for example "hopping[3].amplitude" (blocks counted from 1).</summary>
    public string Field { get; }
    /// <summary>What is wrong, without the place.</summary>
    public string Problem { get; }
    /// <summary>The closest valid name when the problem looks like a typo.</summary>
    public string? Suggestion { get; }

    public ModelError(SourceLocation where, string field, string problem, string? suggestion = null)
        : base(Format(where, field, problem, suggestion))
    {
        File = where.File; Line = where.Line; Column = where.Column;
        Field = field; Problem = problem; Suggestion = suggestion;
    }

    private static string Format(SourceLocation where, string field, string problem, string? suggestion)
    {
        string place = where.File;
        if (where.Line is int l) place += $":{l}";
        if (where.Line is not null && where.Column is int c) place += $":{c}";
        string head = string.IsNullOrEmpty(field) ? place : $"{place}: {field}";
        return $"{head}: {problem}{NameSuggestion.Format(suggestion)}";
    }
}
