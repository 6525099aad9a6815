namespace Meanfield.Models;

/// <summary>A problem inside one expression text; <see cref="Offset"/> is the 0-based character where it was found.</summary>
public sealed class ExpressionException(string message, int offset, string? suggestion = null)
    : Exception(message + NameSuggestion.Format(suggestion))
{
    /// <summary>The problem without the suggestion.</summary>
    public string Problem { get; } = message;
    public int Offset { get; } = offset;
    public string? Suggestion { get; } = suggestion;
}
