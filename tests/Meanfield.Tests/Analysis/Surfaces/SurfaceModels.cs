using System.Numerics;
using Meanfield.Binding;
using Meanfield.Analysis.Surfaces;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Tests.Analysis;

namespace Meanfield.Tests.Analysis.Surfaces;

/// <summary>Small lattice models for the surface tests (invented parameters).</summary>
internal static class SurfaceModels
{
    /// <summary>The Fu-Kane-Mele diamond model of <see cref="AnalysisModels.FuKaneMele"/> (t, lambda, dt, m; a = 1).</summary>
    public static BlochHamiltonian FuKaneMele(double t, double lambda, double dt, double m = 0) => AnalysisModels.FuKaneMele(t, lambda, dt, m);

    /// <summary>
    /// Spinless simple-cubic band with hopping -t along x, y (set <paramref name="inPlane"/> = false to drop it) and
    /// -t along z: along z the crystal is a set of tight-binding chains.
    /// </summary>
    public static BlochHamiltonian Chains(double t, bool inPlane, double a = 1.0)
    {
        var amp = FlavourMatrix.Identity(1, -t);
        var hops = new List<Hopping> { new(0, 0, (0, 0, 1), amp, "z") };
        if (inPlane) { hops.Add(new(0, 0, (1, 0, 0), amp, "x")); hops.Add(new(0, 0, (0, 1, 0), amp, "y")); }
        return new(new BoundModel
        {
            Name = "chains", Lattice = Lattice.Create(LatticeKind.SimpleCubic, a), Flavours = 1,
            Sites = [new Site("A", Vec3.Zero)], Orbitals = [new Orbital("s", 0, OrbitalKind.Conduction)],
            Shells = [], Hoppings = hops, Onsite = [], ElectronsPerCell = 0.5,
        });
    }

    /// <summary>
    /// The two-band lattice Weyl model t [sin(kx a) sx + sin(ky a) sy + (cos kz a - cos k0 a + 2 - cos kx a - cos ky a) sz]
    /// on a simple-cubic lattice, nodes at (0, 0, +-k0) (common practice for a minimal Weyl lattice model), one electron
    /// per cell; <paramref name="mirror"/> = -1 gives the mirror image (kx -> -kx, chiralities reversed).
    /// </summary>
    public static BlochHamiltonian Weyl(double t, double k0a, int mirror = 1) => AnalysisModels.LatticeWeyl(t, k0a, 1.0, mirror);

    /// <summary>-Im Tr G / pi at z for the slab's top principal layer from its eigen-decomposition.</summary>
    public static double SlabTopSpectral(Slab slab, Vec3 kPar, Complex z)
    {
        var w = new SlabBands.Worker(slab);
        w.Solve(kPar);
        double a = 0;
        for (int m = 0; m < slab.Size; m++)
        {
            double top = slab.FaceWeights(w.Vectors, m, 1).Top;
            a += -top * (1 / (z - w.Values[m])).Imaginary / Math.PI;
        }
        return a;
    }
}
