using System.Globalization;
using System.Numerics;

namespace Meanfield.Models;

/// <summary>
/// Recursive-descent parser for model-file amplitudes: + - * / ^ (power, right-associative, binding tighter than unary
/// minus, so -2^2 = -4), parentheses, sqrt exp sin cos, the constants pi and i, numbers such as 1e-3, parameter names.
/// </summary>
/// <remarks>
/// Our own parser rather than a general expression library: the ones available here read ^ as bitwise XOR, evaluate
/// 1/2 as integer division and have no complex numbers, while spin-orbit coefficients such as "0.5*i*lso" need complex
/// arithmetic and every error must point at the offending character of the file.
/// </remarks>
public static class ExpressionParser
{
    /// <summary>Names that cannot be parameters.</summary>
    public static readonly IReadOnlyList<string> Reserved = ["pi", "i", .. CallExpression.Functions];

    public static Expression Parse(string text)
    {
        var p = new State(text);
        p.SkipSpace();
        if (p.AtEnd) throw new ExpressionException("empty expression", 0);
        var e = p.Sum();
        p.SkipSpace();
        if (!p.AtEnd)
            throw new ExpressionException(p.Peek == ')' ? "unbalanced ')'" : $"unexpected '{p.Peek}'", p.Pos);
        return e;
    }

    private sealed class State(string text)
    {
        public int Pos;
        public bool AtEnd => Pos >= text.Length;
        public char Peek => text[Pos];

        public void SkipSpace() { while (!AtEnd && char.IsWhiteSpace(Peek)) Pos++; }

        private bool Accept(char c)
        {
            SkipSpace();
            if (!AtEnd && Peek == c) { Pos++; return true; }
            return false;
        }

        public Expression Sum()
        {
            var left = Product();
            while (true)
            {
                SkipSpace();
                int at = Pos;
                if (Accept('+')) left = new BinaryExpression('+', left, Product(), at);
                else if (Accept('-')) left = new BinaryExpression('-', left, Product(), at);
                else return left;
            }
        }

        private Expression Product()
        {
            var left = Unary();
            while (true)
            {
                SkipSpace();
                int at = Pos;
                if (Accept('*')) left = new BinaryExpression('*', left, Unary(), at);
                else if (Accept('/')) left = new BinaryExpression('/', left, Unary(), at);
                else return left;
            }
        }

        private int _depth;

        // Every level of nesting passes through here; the cap keeps absurd input from overflowing the stack.
        private Expression Unary()
        {
            SkipSpace();
            int at = Pos;
            if (++_depth > 100) throw new ExpressionException("expression is nested too deeply", at);
            try
            {
                if (Accept('-')) return new UnaryExpression(Unary(), at);
                if (Accept('+')) return Unary();
                return Power();
            }
            finally { _depth--; }
        }

        private Expression Power()
        {
            var b = Primary();
            SkipSpace();
            int at = Pos;
            // Right-associative: the exponent is itself a unary expression, so 2^3^2 = 2^9 and 2^-1 = 0.5.
            return Accept('^') ? new BinaryExpression('^', b, Unary(), at) : b;
        }

        private Expression Primary()
        {
            SkipSpace();
            int at = Pos;
            if (AtEnd) throw new ExpressionException("expression ends where a value was expected", Pos);
            char c = Peek;
            if (c == '(')
            {
                Pos++;
                var inner = Sum();
                if (!Accept(')')) throw new ExpressionException("missing ')'", AtEnd ? Pos : Pos);
                return inner;
            }
            if (char.IsDigit(c) || c == '.') return Number();
            if (char.IsLetter(c) || c == '_')
            {
                while (!AtEnd && (char.IsLetterOrDigit(Peek) || Peek == '_')) Pos++;
                string name = text[at..Pos];
                SkipSpace();
                if (!AtEnd && Peek == '(')
                {
                    if (Array.IndexOf(CallExpression.Functions, name) < 0)
                        throw new ExpressionException($"unknown function '{name}'", at,
                            NameSuggestion.Closest(name, CallExpression.Functions));
                    Pos++;
                    var arg = Sum();
                    if (!Accept(')')) throw new ExpressionException("missing ')'", Pos);
                    return new CallExpression(name, arg, at);
                }
                return name switch
                {
                    "pi" => new NumberExpression(Math.PI, at),
                    "i" => new NumberExpression(Complex.ImaginaryOne, at),
                    _ when Array.IndexOf(CallExpression.Functions, name) >= 0 =>
                        throw new ExpressionException($"function '{name}' needs an argument in parentheses", at),
                    _ => new NameExpression(name, at),
                };
            }
            throw new ExpressionException($"unexpected '{c}'", at);
        }

        private NumberExpression Number()
        {
            int at = Pos;
            while (!AtEnd && (char.IsDigit(Peek) || Peek == '.')) Pos++;
            if (!AtEnd && (Peek == 'e' || Peek == 'E'))
            {
                int save = Pos;
                Pos++;
                if (!AtEnd && (Peek == '+' || Peek == '-')) Pos++;
                if (AtEnd || !char.IsDigit(Peek)) Pos = save; // "2e" is 2 followed by a name: let the caller complain
                else while (!AtEnd && char.IsDigit(Peek)) Pos++;
            }
            string s = text[at..Pos];
            if (!double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out double v))
                throw new ExpressionException($"malformed number '{s}'", at);
            return new NumberExpression(v, at);
        }
    }
}
