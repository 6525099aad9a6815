using Meanfield.Models;
using Meanfield.Solver;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.FiniteU;

/// <summary>
/// The U field of a correlated shell: infinite when absent, finite and >= 0 when given, and only on N = 2 shells (the
/// four-boson representation of Kotliar &amp; Ruckenstein, PRL 57, 1362 (1986), is written for spin 1/2). Bad values
/// name file, line and field (common practice for input validation).
/// </summary>
public class FiniteUModelTests
{
    private static string WithU(string u) => ModelText.Valid.Replace("level = \"ef\"", $"level = \"ef\"\nU = {u}");

    [Fact]
    public void Absent_U_is_infinite()
    {
        var shell = Assert.Single(ModelText.Bind(ModelText.Valid).Shells);
        Assert.True(double.IsPositiveInfinity(shell.U));
        Assert.False(shell.HasFiniteU);
    }

    [Fact]
    public void Finite_U_is_read_with_parameters()
    {
        var shell = Assert.Single(ModelText.Bind(WithU("\"4 * t\"")).Shells);
        Assert.Equal(400, shell.U);
        Assert.True(shell.HasFiniteU);
    }

    [Fact]
    public void Negative_U_names_line_and_field()
    {
        var toml = WithU("-5");
        var e = ModelText.Error(toml);
        Assert.Equal(ModelText.LineOf(toml, "U = -5"), e.Line);
        Assert.Equal("site[1].shell.U", e.Field);
        Assert.StartsWith($"test.toml:{e.Line}:", e.Message);
        Assert.Contains("negative", e.Message);
    }

    [Fact]
    public void Finite_U_with_four_flavours_is_refused()
    {
        var toml = WithU("300").Replace("electrons_per_cell = 2", "electrons_per_cell = 2\nflavours = 4");
        var e = ModelText.Error(toml);
        Assert.Equal(ModelText.LineOf(toml, "U = 300"), e.Line);
        Assert.Equal("site[1].shell.U", e.Field);
        Assert.Contains("N = 2", e.Message);
    }

    [Fact]
    public void Lattice_solver_refuses_finite_U_instead_of_ignoring_it()
    {
        var model = ModelText.Bind(WithU("300"));
        var ex = Assert.Throws<RequestError>(() => new SaddlePointSolver(model, new SolverSettings()));
        Assert.Contains("finite U", ex.Message);
    }
}
