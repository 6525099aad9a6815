using System.Numerics;
using Meanfield.Models;

namespace Meanfield.Tests.Models;

/// <summary>
/// The amplitude language against ordinary arithmetic: precedence and associativity as in common mathematical
/// notation (common practice: ^ binds tighter than unary minus and is right-associative, -2^2 = -4, 2^3^2 = 512),
/// complex arithmetic with i (i^2 = -1), and errors that point at the offending character.
/// </summary>
public class ExpressionParserTests
{
    private static readonly Dictionary<string, Complex> Names = new() { ["t"] = 100, ["lso"] = 10, ["V"] = 3 };

    private static Complex Eval(string text) => ExpressionParser.Parse(text).Evaluate(Names);

    [Theory]
    [InlineData("1 + 2 * 3", 7)]
    [InlineData("(1 + 2) * 3", 9)]
    [InlineData("10 - 4 - 3", 3)]          // left-associative minus
    [InlineData("12 / 3 / 2", 2)]          // left-associative division
    [InlineData("1/2", 0.5)]               // real division, not integer division
    [InlineData("2^3^2", 512)]             // right-associative power: 2^(3^2)
    [InlineData("-2^2", -4)]               // power before unary minus
    [InlineData("2^-1", 0.5)]
    [InlineData("(-2)^2", 4)]
    [InlineData("(-2)^3", -8)]
    [InlineData("-t", -100)]
    [InlineData("0.25*t", 25)]
    [InlineData("1e-3 * t", 0.1)]
    [InlineData("2.5E+2", 250)]
    [InlineData("sqrt(V^2 + 16)", 5)]      // 3-4-5 triangle
    [InlineData("exp(0) + cos(0) + sin(0)", 2)]
    [InlineData("- - 3", 3)]
    [InlineData("+3", 3)]
    public void Real_arithmetic(string text, double expected) =>
        Assert.Equal(expected, Eval(text).Real, 12);

    [Fact]
    public void Pi_is_the_circle_constant() => Assert.Equal(Math.PI, Eval("pi").Real, 15);

    [Fact]
    public void Cos_pi_is_minus_one() => Assert.Equal(-1, Eval("cos(pi)").Real, 14);

    [Fact]
    public void Imaginary_unit_squares_to_minus_one()
    {
        var z = Eval("i^2");
        Assert.Equal(-1, z.Real, 14);
        Assert.Equal(0, z.Imaginary, 14);
    }

    [Fact]
    public void Spin_orbit_coefficient_is_imaginary()
    {
        var z = Eval("0.5*i*lso");
        Assert.Equal(0, z.Real, 14);
        Assert.Equal(5, z.Imaginary, 14);
    }

    [Fact]
    public void Euler_formula_holds()
    {
        // e^{i pi/3} = 1/2 + i sqrt(3)/2 (Euler's formula).
        var z = Eval("exp(i*pi/3)");
        Assert.Equal(0.5, z.Real, 14);
        Assert.Equal(Math.Sqrt(3) / 2, z.Imaginary, 14);
    }

    [Fact]
    public void Square_root_of_a_negative_number_is_imaginary()
    {
        var z = Eval("sqrt(-4)");
        Assert.Equal(0, z.Real, 14);
        Assert.Equal(2, z.Imaginary, 14);
    }

    [Fact]
    public void Complex_division() // (1 + 2i)/(3 - 4i) = (-5 + 10i)/25
    {
        var z = Eval("(1 + 2*i)/(3 - 4*i)");
        Assert.Equal(-0.2, z.Real, 14);
        Assert.Equal(0.4, z.Imaginary, 14);
    }

    [Theory]
    [InlineData("2 * (t + 1", 10, "missing ')'")]
    [InlineData("t + ", 4, "ends where a value was expected")]
    [InlineData("2 $ 3", 2, "unexpected '$'")]
    [InlineData("t)", 1, "unbalanced ')'")]
    [InlineData("", 0, "empty")]
    [InlineData("sqr(4)", 0, "unknown function 'sqr'")]
    [InlineData("3 * sqrt", 4, "needs an argument")]
    [InlineData("1.2.3", 0, "malformed number")]
    [InlineData("2 t", 2, "unexpected 't'")]
    public void Syntax_errors_point_at_the_character(string text, int offset, string message)
    {
        var e = Assert.Throws<ExpressionException>(() => ExpressionParser.Parse(text));
        Assert.Equal(offset, e.Offset);
        Assert.Contains(message, e.Message);
    }

    [Fact]
    public void Unknown_function_suggests_the_closest()
    {
        var e = Assert.Throws<ExpressionException>(() => ExpressionParser.Parse("sqr(4)"));
        Assert.Equal("sqrt", e.Suggestion);
    }

    [Fact]
    public void Division_by_zero_is_an_error_at_the_operator()
    {
        var e = Assert.Throws<ExpressionException>(() => Eval("t / (V - 3)"));
        Assert.Equal(2, e.Offset);
        Assert.Contains("division by zero", e.Message);
    }

    [Fact]
    public void Unknown_name_suggests_the_closest_parameter()
    {
        var e = Assert.Throws<ExpressionException>(() => Eval("2 * lsoo"));
        Assert.Equal(4, e.Offset);
        Assert.Equal("lso", e.Suggestion);
        Assert.Contains("(did you mean 'lso'?)", e.Message);
    }

    [Fact]
    public void Deep_nesting_is_an_error_not_a_crash() =>
        Assert.Contains("nested too deeply", Assert.Throws<ExpressionException>(() => ExpressionParser.Parse(new string('(', 5000) + "1" + new string(')', 5000))).Message);

    [Fact]
    public void Overflow_is_an_error() =>
        Assert.Contains("finite", Assert.Throws<ExpressionException>(() => Eval("exp(1000)")).Message);

    [Fact]
    public void Names_lists_parameters_in_order() =>
        Assert.Equal(["t", "V", "t"], ExpressionParser.Parse("t*sqrt(V) - 2^t").Names().Select(n => n.Name));
}
