using Meanfield.Binding;
using Meanfield.Models;

namespace Meanfield.Tests.Models;

/// <summary>Helpers for tests that parse small model texts.</summary>
internal static class ModelText
{
    public static BoundModel Bind(string toml, IReadOnlyDictionary<string, string>? overrides = null) =>
        ModelBinder.Bind(ModelFile.Parse(toml, "test.toml"), overrides);

    /// <summary>The error loading and binding <paramref name="toml"/> must raise.</summary>
    public static ModelError Error(string toml, IReadOnlyDictionary<string, string>? overrides = null) =>
        Assert.Throws<ModelError>(() => Bind(toml, overrides));

    /// <summary>1-based line of the first line of <paramref name="toml"/> containing <paramref name="marker"/>.</summary>
    public static int LineOf(string toml, string marker)
    {
        var lines = toml.Replace("\r\n", "\n").Split('\n');
        for (int i = 0; i < lines.Length; i++) if (lines[i].Contains(marker)) return i + 1;
        throw new ArgumentException($"marker '{marker}' not in text");
    }

    public static string RepositoryRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "meanfield.sln"))) dir = dir.Parent;
        return dir?.FullName ?? throw new InvalidOperationException("repository root not found");
    }

    /// <summary>A valid simple-cubic Anderson lattice; tests break one piece of it.</summary>
    public const string Valid = """
        [model]
        name = "Test lattice"
        electrons_per_cell = 2

        [parameters]
        t = 100
        V = 50
        ef = -200

        [lattice]
        kind = "simple-cubic"
        constant = 4.0

        [[site]]
        name = "A"
        position = [0, 0, 0]
        orbitals = ["d"]
        [site.shell]
        name = "f"
        level = "ef"

        [[hopping]]
        from = "A:d"
        to = "A:d"
        neighbour = 1
        amplitude = "-t"

        [[hybridization]]
        from = "A:d"
        to = "A:f"
        amplitude = "V"
        """;
}
