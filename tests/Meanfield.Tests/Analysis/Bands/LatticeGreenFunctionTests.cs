using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Xunit.Abstractions;

namespace Meanfield.Tests.Analysis.Bands;

/// <summary>
/// Watson's integrals, the lattice Green functions at the top band edge, as Brillouin-zone averages of the bands of
/// models built from our own types: a check of the Bloch assembly, of the lattices' reciprocal vectors and of the
/// shifted Monkhorst-Pack mesh against closed forms (Watson, Q. J. Math. 10, 266 (1939); Glasser &amp; Zucker,
/// PNAS 74, 1800 (1977)).
/// </summary>
public class LatticeGreenFunctionTests(ITestOutputHelper output)
{
    /// <summary>Zone average of 1/(w - eps(k)) over a shifted n^3 mesh (the shift avoids the singular point Gamma).</summary>
    private static double MeshAverage(BoundModel model, int n, double w)
    {
        var h = new BlochHamiltonian(model);
        var mesh = new KMesh(model.Lattice, n, shifted: true);
        double sum = 0;
        var m = new Complex[1]; var scratch = new Complex[1];
        for (int i = 0; i < mesh.Count; i++)
        {
            h.Assemble(mesh.Cartesian(i), m, scratch);
            sum += 1 / (w - m[0].Real);
        }
        return sum / mesh.Count;
    }

    /// <summary>
    /// The integrand ~ 1/q^2 near Gamma makes the mesh error a series in 1/n (the missing cell around the singular
    /// point weighs ~ q_min ~ 1/n); Richardson extrapolation removes the 1/n and 1/n^2 terms from n, 2n, 4n.
    /// </summary>
    private double Extrapolate(BoundModel model, double w, int n0, string name)
    {
        double g1 = MeshAverage(model, n0, w), g2 = MeshAverage(model, 2 * n0, w), g4 = MeshAverage(model, 4 * n0, w);
        double r1 = 2 * g2 - g1, r2 = 2 * g4 - g2;    // 1/n removed
        double r = (4 * r2 - r1) / 3;                 // 1/n^2 removed
        output.WriteLine($"{name}: G(n={n0}) = {g1:F7}, G(n={2 * n0}) = {g2:F7}, G(n={4 * n0}) = {g4:F7}; " +
                         $"1/n-extrapolated {r1:F7}, {r2:F7}; 1/n^2-extrapolated {r:F7}");
        return r;
    }

    [Fact]
    public void SimpleCubicWatsonIntegral()
    {
        // W_sc = pi^-3 Int d^3theta / (3 - c1 - c2 - c3) = sqrt6/(96 pi^3) Gamma(1/24)Gamma(5/24)Gamma(7/24)Gamma(11/24)
        //      = 0.5054620197 (Glasser & Zucker 1977). With hopping t = -1/2, eps(k) = c1 + c2 + c3.
        var model = TightBindingModels.SimpleCubic(1.0, -0.5);
        double w = Extrapolate(model, 3.0, 12, "simple cubic");
        Assert.Equal(0.5054620197, w, 2e-4);   // measured: 0.5054442 from n = 12, 24, 48
        Assert.True(Math.Abs(MeshAverage(model, 12, 3.0) - 0.5054620197) > 5e-3, "the raw mesh alone must not already agree");
    }

    [Fact]
    public void BodyCentredWatsonIntegral()
    {
        // W_bcc = pi^-3 Int d^3theta / (1 - c1 c2 c3) = Gamma(1/4)^4 / (4 pi^3) = 1.3932039297 (Watson 1939).
        // With t = -1/8 the bcc band is eps = cos(kx a/2) cos(ky a/2) cos(kz a/2); its zone average equals the
        // theta-cube average because the function has the reciprocal-lattice periodicity.
        var model = TightBindingModels.BodyCentred(1.0, -0.125);
        double w = Extrapolate(model, 1.0, 12, "body-centred cubic");
        Assert.Equal(1.3932039297, w, 2e-4);   // measured: 1.3931685 from n = 12, 24, 48
    }
}
