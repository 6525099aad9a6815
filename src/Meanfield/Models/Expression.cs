using System.Numerics;

namespace Meanfield.Models;

/// <summary>
/// A parsed arithmetic expression over complex numbers (amplitudes, parameters). Leaves are numbers, the constants
/// pi and i, and parameter names; nodes carry the 0-based offset of their first character for error messages.
/// </summary>
public abstract record Expression(int Offset)
{
    /// <summary>Value with every parameter name looked up in <paramref name="names"/>; throws <see cref="ExpressionException"/>.</summary>
    public abstract Complex Evaluate(IReadOnlyDictionary<string, Complex> names);

    /// <summary>Parameter names the expression refers to, in order of appearance.</summary>
    public IEnumerable<(string Name, int Offset)> Names()
    {
        switch (this)
        {
            case NameExpression n: yield return (n.Name, n.Offset); break;
            case UnaryExpression u: foreach (var x in u.Operand.Names()) yield return x; break;
            case CallExpression c: foreach (var x in c.Argument.Names()) yield return x; break;
            case BinaryExpression b:
                foreach (var x in b.Left.Names()) yield return x;
                foreach (var x in b.Right.Names()) yield return x;
                break;
        }
    }

    internal static Complex Finite(Complex z, int offset) =>
        double.IsFinite(z.Real) && double.IsFinite(z.Imaginary) ? z
            : throw new ExpressionException("the result is not a finite number", offset);
}

public sealed record NumberExpression(Complex Value, int Offset) : Expression(Offset)
{
    public override Complex Evaluate(IReadOnlyDictionary<string, Complex> names) => Value;
}

public sealed record NameExpression(string Name, int Offset) : Expression(Offset)
{
    public override Complex Evaluate(IReadOnlyDictionary<string, Complex> names)
    {
        if (names.TryGetValue(Name, out var v)) return v;
        throw new ExpressionException($"unknown parameter '{Name}'", Offset, NameSuggestion.Closest(Name, names.Keys));
    }
}

public sealed record UnaryExpression(Expression Operand, int Offset) : Expression(Offset)
{
    public override Complex Evaluate(IReadOnlyDictionary<string, Complex> names) => -Operand.Evaluate(names);
}

public sealed record CallExpression(string Function, Expression Argument, int Offset) : Expression(Offset)
{
    public static readonly string[] Functions = ["sqrt", "exp", "sin", "cos"];

    public override Complex Evaluate(IReadOnlyDictionary<string, Complex> names)
    {
        var x = Argument.Evaluate(names);
        bool real = x.Imaginary == 0;
        var y = Function switch
        {
            // Real arguments keep real arithmetic so that sqrt(2)^2 and friends are not polluted by complex rounding.
            "sqrt" => real && x.Real >= 0 ? Math.Sqrt(x.Real) : Complex.Sqrt(x),
            "exp" => real ? Math.Exp(x.Real) : Complex.Exp(x),
            "sin" => real ? Math.Sin(x.Real) : Complex.Sin(x),
            "cos" => real ? Math.Cos(x.Real) : Complex.Cos(x),
            _ => throw new ExpressionException($"unknown function '{Function}'", Offset),
        };
        return Finite(y, Offset);
    }
}

public sealed record BinaryExpression(char Operator, Expression Left, Expression Right, int Offset) : Expression(Offset)
{
    public override Complex Evaluate(IReadOnlyDictionary<string, Complex> names)
    {
        var a = Left.Evaluate(names);
        var b = Right.Evaluate(names);
        return Operator switch
        {
            '+' => a + b,
            '-' => a - b,
            '*' => Finite(a * b, Offset),
            '/' => b == Complex.Zero ? throw new ExpressionException("division by zero", Offset) : Finite(a / b, Offset),
            '^' => Finite(Power(a, b), Offset),
            _ => throw new ExpressionException($"unknown operator '{Operator}'", Offset),
        };
    }

    private Complex Power(Complex a, Complex b)
    {
        if (a.Imaginary == 0 && b.Imaginary == 0 && (a.Real >= 0 || b.Real == Math.Round(b.Real)))
        {
            if (a.Real == 0 && b.Real < 0) throw new ExpressionException("division by zero (zero to a negative power)", Offset);
            return Math.Pow(a.Real, b.Real);
        }
        if (a == Complex.Zero) return b.Real > 0 ? Complex.Zero : throw new ExpressionException("zero to a non-positive complex power", Offset);
        return Complex.Pow(a, b);
    }
}
