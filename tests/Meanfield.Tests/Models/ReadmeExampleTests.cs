using Meanfield.Binding;
using Meanfield.Models;

namespace Meanfield.Tests.Models;

/// <summary>The commented example in models/README.md is a valid model (documentation that cannot rot).</summary>
public class ReadmeExampleTests
{
    private static string Example()
    {
        var text = File.ReadAllText(Path.Combine(ModelText.RepositoryRoot(), "models", "README.md"));
        int start = text.IndexOf("```toml\n", StringComparison.Ordinal) + "```toml\n".Length;
        int end = text.IndexOf("```", start, StringComparison.Ordinal);
        return text[start..end];
    }

    [Fact]
    public void Example_loads_and_binds()
    {
        var m = ModelBinder.Bind(ModelFile.Parse(Example(), "README.md"));
        Assert.Equal(8, m.BasisSize);
        Assert.Equal(4, m.ElectronsPerCell);
        Assert.Equal(2, m.Shells.Count);
        Assert.Equal(2, m.Hoppings.Count(h => m.Orbitals[h.To].Kind == OrbitalKind.Correlated));
        Assert.Equal(16, m.Solver!.Mesh);
    }

    [Fact]
    public void Example_overrides_work()
    {
        var m = ModelBinder.Bind(ModelFile.Parse(Example(), "README.md"), new Dictionary<string, string> { ["t"] = "250", ["m"] = "10" });
        Assert.Equal(150, m.Parameters.Single(p => p.Key == "V").Value, 12); // V = 0.6 t follows the override
    }
}
