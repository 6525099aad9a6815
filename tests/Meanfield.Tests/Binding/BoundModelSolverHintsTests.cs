using Meanfield.Binding;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.Binding;

/// <summary>The solver hints travel with the bound model, also through renormalized copies.</summary>
public class BoundModelSolverHintsTests
{
    [Fact]
    public void With_keeps_the_solver_hints()
    {
        var model = ModelText.Bind(ModelText.Valid + "\n[solver]\nmesh = 20\n");
        var copy = model.With(hoppings: [], name: "renormalized");
        Assert.Equal("renormalized", copy.Name);
        Assert.Empty(copy.Hoppings);
        Assert.Equal(20, copy.Solver!.Mesh);
    }

    [Fact]
    public void Model_without_solver_table_has_no_hints() =>
        Assert.Null(ModelText.Bind(ModelText.Valid).Solver);

    [Fact]
    public void Bound_model_keeps_the_source_text_and_path()
    {
        var model = ModelText.Bind(ModelText.Valid);
        Assert.Equal("test.toml", model.SourcePath);
        Assert.Equal(ModelText.Valid, model.SourceText);
    }
}
