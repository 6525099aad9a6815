using System.Numerics;
using Meanfield.Analysis.Nodes;
using Meanfield.Analysis.Responses;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>
/// The Berry curvature dipole of linear Weyl cones, D_ab = Int d^3k/(2 pi)^3 sum_n (-df/dE) dE_n/dk_a Omega_n,b
/// (Sodemann &amp; Fu, PRL 115, 216806 (2015), Eq. 3, integrated by parts). For E = w.k +- |V k| the substitution q = V k
/// reduces it to the isotropic cone of tilt t = V^-1 w, whose Fermi sphere k(theta) = mu / (v (1 + t cos theta)) gives
/// D = -chi / (16 pi^3) V I(t) V^-1, I_ab = Int dOmega k_b (t_a + k_a) / (1 + t.k) (derived here, both bands alike):
/// independent of mu and T while the cones stay linear. Its trace, -chi / (4 pi^2), is the Berry flux of one Fermi
/// surface around a node (de Juan, Grushin, Morimoto &amp; Moore, Nat. Commun. 8, 15995 (2017)).
/// </summary>
public sealed class ConeDipoleTests
{
    /// <summary>
    /// The angular integrals against a direct quadrature over the sphere (I_perp = pi Int (1 - u^2)/(1 + t u) du,
    /// I_par = 2 pi Int u (t + u)/(1 + t u) du), the trace 4 pi at every tilt, and the untilted value 4 pi / 3.
    /// </summary>
    [Theory]
    [InlineData(0.0)]
    [InlineData(0.004)]
    [InlineData(0.3)]
    [InlineData(0.9)]
    public void AngularIntegralsMatchQuadrature(double t)
    {
        var (perp, par) = ConeDipole.Integrals(t);
        double qPerp = 0, qPar = 0;
        const int n = 200000;
        for (int i = 0; i < n; i++)
        {
            double u = -1 + (i + 0.5) * 2.0 / n, du = 2.0 / n;
            qPerp += Math.PI * (1 - u * u) / (1 + t * u) * du;
            qPar += 2 * Math.PI * u * (t + u) / (1 + t * u) * du;
        }
        Assert.Equal(qPerp, perp, 8);
        Assert.Equal(qPar, par, 8);
        Assert.Equal(4 * Math.PI, 2 * perp + par, 12);
        if (t == 0) Assert.Equal(4 * Math.PI / 3, perp, 14);
    }

    /// <summary>Each cone's trace is -chi/(4 pi^2) whatever its tilt and anisotropy (de Juan et al. 2017).</summary>
    [Fact]
    public void TraceIsTheQuantizedFlux()
    {
        var v = new double[,] { { 1.3, 0.2, 0 }, { 0.2, 0.7, 0.1 }, { 0, 0.1, 0.9 } };
        var d = new double[9];
        ConeDipole.Accumulate(d, -1, v, new Vec3(0.3, -0.2, 0.25));
        Assert.Equal(1 / (4 * Math.PI * Math.PI), d[0] + d[4] + d[8], 13);
    }

    /// <summary>
    /// A lattice Weyl model with two nodes at one energy whose tilts are neither equal nor opposite: the zone integral
    /// at a temperature well inside the linear range agrees with the cone limit from the node search (measured: 1.1% and
    /// 0.9% on the two nonzero components D_xz and D_zx, which differ by 30%: the anisotropy V I V^-1 is resolved).
    /// </summary>
    [Fact]
    public void ZoneIntegralTendsToTheConeLimit()
    {
        var h = TiltedWeylPair(m: 2.5, gz: 0.15, gx: 0.15);
        var search = NodeSearch.Find(h, 1, 0, new NodeSearchOptions { Mesh = 12 });
        Assert.Equal(2, search.Nodes.Count);
        Assert.All(search.Nodes, n => Assert.NotNull(n.Chirality));
        double e0 = search.Nodes[0].Energy;
        Assert.Equal(e0, search.Nodes[1].Energy, 10);
        var cone = ConeDipole.FromNodes(search);
        Assert.True(cone.Complete);
        Assert.Equal(2, cone.Cones);

        const double kT = 0.02;
        var mesh = new ResponseMesh { Divisions = 24, RefinementLevels = 3, ThermalWidth = kT, RefinementWindow = (e0 - 15 * kT, e0 + 15 * kT) };
        var zone = CurvatureDipole.Compute(h, [e0], [kT], mesh).Tensor[0, 0];
        double scale = cone.Tensor.Max(Math.Abs);
        Assert.True(scale > 1e-4, $"the tilts should give a nonzero dipole, largest |D| = {scale}");
        for (int i = 0; i < 9; i++)
            Assert.True(Math.Abs(zone[i] - cone.Tensor[i]) < 0.03 * scale,
                        $"D[{i / 3},{i % 3}]: zone {zone[i]:G5} against cone limit {cone.Tensor[i]:G5}");
    }

    // Two bands on a simple cubic lattice (a = 1): d = (sin kx, sin ky, m - cos kx - cos ky - cos kz), nodes at
    // kz = +-arccos(m - 2), plus gz cos kz + gx sin kx cos kz, which tilts them along z oppositely and along x alike
    // while keeping both at the energy gz cos k0 (invented numbers).
    private static BlochHamiltonian TiltedWeylPair(double m, double gz, double gx)
    {
        var i = Complex.ImaginaryOne;
        FlavourMatrix P(Complex a0, Complex ax, Complex ay, Complex az) => FlavourMatrix.Pauli(a0, ax, ay, az);
        var hops = new List<Hopping>
        {
            new(0, 0, (1, 0, 0), P(0, 1 / (2 * i), 0, -0.5), "x"),
            new(0, 0, (0, 1, 0), P(0, 0, 1 / (2 * i), -0.5), "y"),
            new(0, 0, (0, 0, 1), P(gz / 2, 0, 0, -0.5), "z"),
            new(0, 0, (1, 0, 1), P(gx / (4 * i), 0, 0, 0), "xz+"),
            new(0, 0, (1, 0, -1), P(gx / (4 * i), 0, 0, 0), "xz-"),
        };
        return new(new BoundModel
        {
            Name = "tilted-weyl-pair", Lattice = Lattice.Create(LatticeKind.SimpleCubic, 1), Flavours = 2,
            Sites = [new("A", Vec3.Zero)], Orbitals = [new("d", 0, OrbitalKind.Conduction)], Shells = [],
            Hoppings = hops, Onsite = [new(0, P(0, 0, 0, m), "m")], ElectronsPerCell = 1,
        });
    }

    /// <summary>A refinement that would outgrow its sample budget stops with the numbers instead of exhausting memory.</summary>
    [Fact]
    public void RefinementBeyondTheBudgetIsRefused()
    {
        var h = TiltedWeylPair(m: 2.5, gz: 0.15, gx: 0.15);
        var mesh = new ResponseMesh { Divisions = 12, RefinementLevels = 4, ThermalWidth = 0.001 };
        var e = Assert.Throws<RequestError>(() => CurvatureSamples.Compute(h, mesh, sampleLimit: 20000));
        Assert.Contains("fewer refinement levels", e.Message);
    }
}
