using Meanfield.Cli;
using Meanfield.Tests.Models;

namespace Meanfield.Tests.Cli;

/// <summary>Runs meanfield commands in-process in a fresh temporary folder, capturing stdout and stderr.</summary>
internal sealed class CliHarness : IDisposable
{
    public string Folder { get; } = Directory.CreateTempSubdirectory("meanfield-cli-").FullName;
    public string Out { get; private set; } = "";
    public string Err { get; private set; } = "";

    public static string ShippedModel(string file) => Path.Combine(ModelText.RepositoryRoot(), "models", file);

    public string PathOf(string name) => Path.Combine(Folder, name);

    public string Write(string name, string text)
    {
        var p = PathOf(name);
        File.WriteAllText(p, text);
        return p;
    }

    public int Run(params string[] args)
    {
        var root = CommandTree.Build();
        using var o = new StringWriter();
        using var e = new StringWriter();
        int code = Runner.Run(root, args, o, e);
        Out = o.ToString(); Err = e.ToString();
        return code;
    }

    /// <summary>Files in the folder apart from inputs the test wrote.</summary>
    public string[] Files() => Directory.GetFiles(Folder).Select(Path.GetFileName).OfType<string>().Order().ToArray();

    public void Dispose()
    {
        try { Directory.Delete(Folder, recursive: true); } catch (IOException) { }
    }

    /// <summary>
    /// The Fu-Kane-Mele diamond model with no correlated shells, half filled (2 of 4 bands), in units of t:
    /// hopping t (t + dt on the [111] bond), spin-orbit lso, staggered potential m (Fu, Kane &amp; Mele, PRL 98, 106803
    /// (2007); Murakami, New J. Phys. 9, 356 (2007)).
    /// </summary>
    public const string FuKaneMeleToml = """
        # Test lattice (invented numbers): Fu-Kane-Mele diamond model without correlated shells.
        [model]
        name = "FKM test lattice"
        energy_unit = "eV"
        electrons_per_cell = 2
        flavours = 2

        [parameters]
        t = 1
        dt = 0
        lso = 0.125
        m = 0

        [lattice]
        kind = "diamond"
        constant = 1

        [[site]]
        name = "A"
        orbitals = ["s"]

        [[site]]
        name = "B"
        orbitals = ["s"]

        [[hopping]]
        from = "A:s"
        to = "B:s"
        neighbour = 1
        amplitude = "t"

        [[hopping]]
        from = "A:s"
        to = "B:s"
        vector = [0, 0, 0]
        amplitude = "dt"

        [[spin_orbit_diamond]]
        orbital = "s"
        amplitude = "lso"

        [[staggered]]
        orbital = "s"
        amplitude = "m"
        signs = { A = 1, B = -1 }
        """;
}
