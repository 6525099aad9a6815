using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Models;
using Meanfield.Numerics;
using Meanfield.Tests.Cli;

namespace Meanfield.Tests.Bloch;

/// <summary>
/// Time reversal maps k to -k, so E_n(k) = E_n(-k); with inversion as well every band is twofold degenerate at every k
/// (Kramers' theorem; e.g. Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 31, and common practice).
/// Checked on the bare Hamiltonian of the shipped diamond model, whose staggered potential m breaks inversion.
/// </summary>
public class SymmetryTests
{
    private static double[] Spectrum(BlochHamiltonian h, Meanfield.Lattices.Vec3 k)
    {
        int n = h.Size;
        var m = new Complex[n * n]; var s = new Complex[n * n]; var e = new double[n];
        h.Assemble(k, m, s);
        Eigensolvers.Create(n).Solve(m, e, Span<Complex>.Empty);
        return e;
    }

    [Theory]
    [InlineData("200", false)]
    [InlineData("0", true)]
    public void TimeReversalAndInversion(string m, bool inversion)
    {
        var overrides = new Dictionary<string, string> { ["m"] = m };
        if (inversion) overrides["dt"] = "0";
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("weyl-diamond.toml")), overrides);
        var h = new BlochHamiltonian(model);
        var rng = new Random(11);
        bool splitSomewhere = false;
        for (int trial = 0; trial < 25; trial++)
        {
            var k = model.Lattice.Cartesian(rng.NextDouble(), rng.NextDouble(), rng.NextDouble());
            var plus = Spectrum(h, k); var minus = Spectrum(h, -k);
            for (int b = 0; b < plus.Length; b++) Assert.Equal(plus[b], minus[b], 1e-9);
            for (int b = 0; b < plus.Length; b += 2)
            {
                double split = Math.Abs(plus[b + 1] - plus[b]);
                if (inversion) Assert.True(split < 1e-9, $"band pair {b} split by {split} at {k}");
                splitSomewhere |= split > 1e-6;
            }
        }
        Assert.Equal(!inversion, splitSomewhere);
    }
}
