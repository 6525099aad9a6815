using System.Globalization;
using System.Numerics;

namespace Meanfield.Models;

/// <summary>
/// An expression as written in the model file, with the field it belongs to and the place of its first character,
/// so that evaluation errors point into the file.
/// </summary>
public sealed record ModelExpression(string Text, Expression Tree, string Field, SourceLocation Location)
{
    /// <summary>Parses <paramref name="text"/>; a syntax error becomes a <see cref="ModelError"/> at its character.</summary>
    public static ModelExpression Parse(string text, string field, SourceLocation location)
    {
        try { return new(text, ExpressionParser.Parse(text), field, location); }
        catch (ExpressionException e)
        {
            throw new ModelError(location.Shift(e.Offset), field, $"cannot read expression \"{text}\": {e.Problem}", e.Suggestion);
        }
    }

    /// <summary>A plain number written as a TOML number.</summary>
    public static ModelExpression Constant(double value, string field, SourceLocation location) =>
        new(value.ToString("R", CultureInfo.InvariantCulture), new NumberExpression(value, 0), field, location);

    public Complex Evaluate(IReadOnlyDictionary<string, Complex> names)
    {
        try { return Tree.Evaluate(names); }
        catch (ExpressionException e)
        {
            throw new ModelError(Location.Shift(e.Offset), Field, $"in \"{Text}\": {e.Problem}", e.Suggestion);
        }
    }

    /// <summary>The value, which must be real (imaginary part below 1e-12 of its size).</summary>
    public double EvaluateReal(IReadOnlyDictionary<string, Complex> names)
    {
        var z = Evaluate(names);
        if (Math.Abs(z.Imaginary) > 1e-12 * Math.Max(1, Math.Abs(z.Real)))
            throw new ModelError(Location, Field, $"\"{Text}\" = {z.Real:G6}{z.Imaginary:+0.######;-0.######}i must be a real number");
        return z.Real;
    }
}
