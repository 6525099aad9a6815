using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

/// <summary>
/// Test source (invented parameters): the two-band lattice Weyl model
/// H = c t cos(kz a) + t [sin(kx a) sx + sin(ky a) sy + (cos kz a + 2 - cos kx a - cos ky a) sz] on a simple-cubic
/// lattice, with nodes at k = (0, 0, +-pi/(2a)), both at energy 0, velocity tensor v = t a diag(1, 1, -+1) and tilt
/// v0 = (0, 0, -+c t a): |det hbar v| = (t a)^3 and w = |v^-1 v0| = c at both. With <paramref name="remote"/> &gt; 0 two
/// far bands at -+remote (1 + (cos kx a + cos ky a + cos kz a)/10) are added and filled up to the Weyl pair, so that the
/// cones are a narrow pair inside a spectrum some 2 remote / (6 t) times wider (the heavy-band situation).
/// </summary>
internal sealed class TiltedWeylLattice : IBlochSource
{
    private readonly double _t, _a, _c, _remote;

    public TiltedWeylLattice(double t, double a, double tilt, double remote = 0, EnergyUnit unit = EnergyUnit.MilliElectronVolt)
    {
        _t = t; _a = a; _c = tilt; _remote = remote;
        Size = remote > 0 ? 4 : 2;
        Model = new BoundModel
        {
            Name = "tilted-weyl", Lattice = Lattice.Create(LatticeKind.SimpleCubic, a), Flavours = 1,
            Sites = [new Site("A", Vec3.Zero)],
            Orbitals = Enumerable.Range(0, Size).Select(i => new Orbital($"o{i}", 0, OrbitalKind.Conduction)).ToArray(),
            Shells = [], Hoppings = [], Onsite = [], ElectronsPerCell = remote > 0 ? 2 : 1, Unit = unit,
        };
    }

    public BoundModel Model { get; }
    public int Size { get; }

    public void Assemble(Vec3 k, Span<Complex> h, Span<Complex> scratch)
    {
        double cx = Math.Cos(k.X * _a), cy = Math.Cos(k.Y * _a), cz = Math.Cos(k.Z * _a);
        double dx = _t * Math.Sin(k.X * _a), dy = _t * Math.Sin(k.Y * _a), dz = _t * (cz + 2 - cx - cy), e0 = _c * _t * cz;
        int n = Size;
        h[..(n * n)].Clear();
        int w = _remote > 0 ? 1 : 0; // the Weyl block sits at rows/columns w, w + 1
        h[w * n + w] = e0 + dz; h[(w + 1) * n + w + 1] = e0 - dz;
        h[w * n + w + 1] = new Complex(dx, -dy); h[(w + 1) * n + w] = new Complex(dx, dy);
        if (_remote > 0)
        {
            double band = _remote * (1 + (cx + cy + cz) / 10);
            h[0] = -band; h[3 * n + 3] = band;
        }
    }
}
