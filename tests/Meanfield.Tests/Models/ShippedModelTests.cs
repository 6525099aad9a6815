using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Models;

namespace Meanfield.Tests.Models;

/// <summary>Round trip: every model file shipped in models/ loads, binds and is Hermitian.</summary>
public class ShippedModelTests
{
    public static TheoryData<string> Files()
    {
        var data = new TheoryData<string>();
        foreach (var f in Directory.GetFiles(Path.Combine(ModelText.RepositoryRoot(), "models"), "*.toml").Order())
            data.Add(Path.GetFileName(f));
        return data;
    }

    [Theory]
    [MemberData(nameof(Files))]
    public void Loads_binds_and_is_hermitian(string file)
    {
        var spec = ModelFile.Load(Path.Combine(ModelText.RepositoryRoot(), "models", file));
        var model = ModelBinder.Bind(spec);
        Assert.NotEmpty(model.Orbitals);
        Assert.NotEmpty(model.Shells);
        Assert.InRange(model.ElectronsPerCell, 0, model.StatesPerCell);
        Assert.NotNull(model.Solver);
        Assert.InRange(model.Solver!.Mesh ?? 16, 16, 24);
        // Hermiticity of H(k) at random k: the h.c. of every bond is implied, on-site terms must be Hermitian.
        Assert.True(new BlochHamiltonian(model).HermiticityDefect() < 1e-9);
        Assert.Contains(ModelSummary.Describe(model), l => l.StartsWith("bands: "));
    }

    [Fact]
    public void All_five_expected_models_are_shipped()
    {
        var names = Directory.GetFiles(Path.Combine(ModelText.RepositoryRoot(), "models"), "*.toml").Select(Path.GetFileName).ToList();
        foreach (var f in new[] { "kondo-insulator-sc.toml", "heavy-metal-cubic.toml", "weyl-diamond.toml", "honeycomb-2d.toml", "flat-band.toml" })
            Assert.Contains(f, names);
    }

    [Fact]
    public void Weyl_diamond_is_quarter_filled_with_eight_bands()
    {
        var model = ModelBinder.Bind(ModelFile.Load(Path.Combine(ModelText.RepositoryRoot(), "models", "weyl-diamond.toml")));
        Assert.Equal(8, model.BasisSize);
        Assert.Equal(model.BasisSize / 4.0, model.ElectronsPerCell);
        Assert.Equal(2, model.ShellGroups().Count);
    }
}
