namespace Meanfield.Models;

/// <summary>A place in a model file (1-based line and column), or in a command-line override when Line is null.</summary>
public readonly record struct SourceLocation(string File, int? Line, int? Column)
{
    /// <summary>The same place moved right by <paramref name="characters"/> (a character inside an expression).</summary>
    public SourceLocation Shift(int characters) => this with { Column = Column is int c ? c + characters : null };
}
