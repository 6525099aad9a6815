using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Symmetry;
using Meanfield.Tests.Cli;
using Xunit.Abstractions;

namespace Meanfield.Tests.Symmetry;

/// <summary>
/// The symmetry found by testing H(Sk) = U H(k) U^dag against the point groups of handbook tables: m-3m has order 48,
/// -43m (zincblende) 24, 3m 6, 4/mmm 16, 6/mmm 24, -6m2 12 (International Tables for Crystallography, Vol. A (2016),
/// Table 3.2.3.2); time reversal doubles each group of a non-magnetic model (grey groups; Bradley &amp; Cracknell, The
/// Mathematical Theory of Symmetry in Solids (1972), ch. 7).
/// </summary>
public class SymmetryGroupTests(ITestOutputHelper output)
{
    internal static BoundModel Shipped(string file, IReadOnlyDictionary<string, string>? overrides = null) =>
        ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)), overrides);

    private SymmetryGroup Group(BoundModel model)
    {
        var g = SymmetryGroup.Find(new BlochHamiltonian(model));
        output.WriteLine($"{model.Name}: {g.Summary()}");
        output.WriteLine("  " + string.Join(" ", g.Operations.Select(o => o.Name)));
        foreach (var c in g.Checks.Where(c => !c.Kept).Take(6)) output.WriteLine($"  rejected {c.Name}: {c.Reason}");
        return g;
    }

    [Theory]
    [InlineData("kondo-insulator-sc.toml", 48, 96)]   // m-3m, grey
    [InlineData("heavy-metal-cubic.toml", 48, 96)]    // m-3m, grey
    [InlineData("weyl-diamond.toml", 6, 12)]          // 3m: zincblende -43m lowered by the [111] bond distortion
    [InlineData("honeycomb-2d.toml", 12, 24)]         // -6m2: the site group of honeycomb, keeps both sublattices
    public void ShippedModels(string file, int unitary, int order)
    {
        var g = Group(Shipped(file));
        Assert.Equal(unitary, g.UnitaryCount);
        Assert.Equal(order, g.Order);
    }
}
