using System.Numerics;
using Meanfield.Binding;
using Meanfield.Lattices;

namespace Meanfield.Bloch;

/// <summary>
/// Assembles the Bloch Hamiltonian H(k) of a bound model into caller-provided buffers, with no allocation per k-point.
/// Basis index = orbital * F + flavour. The Bloch phase includes the site positions: a bond t c^dag_{i,0} c_{j,R} contributes
/// t e^{i k.(R + tau_j - tau_i)} to H_ij(k), so Berry curvature sees the true site positions; eigenvalues and
/// chiralities do not depend on this choice, and H(k + G) is unitarily equivalent to H(k).
/// The Hamiltonian is split into a fixed part (conduction bonds, every on-site term) and a scaled part (bonds with a
/// correlated end), which the mean field multiplies by the boson amplitudes; shell levels eps_f are kept apart.
/// </summary>
public sealed class BlochHamiltonian : IBlochSource
{
    private readonly int _n, _f;
    private readonly double[] _dx, _dy, _dz;       // Cartesian bond vectors, angstrom
    private readonly int[] _rowBase, _colBase;      // first basis index of From and To
    private readonly bool[] _scaled;
    private readonly Complex[] _amp;                // F*F per bond
    private readonly Complex[] _onsite;             // Size*Size, k-independent fixed on-site block
    private readonly double[] _levels;
    private readonly int[] _groupOfBasis;

    public BoundModel Model { get; }
    /// <summary>Number of bands: orbitals times flavours.</summary>
    public int Size => _n;
    /// <summary>Bare shell level eps_f on each correlated basis index, 0 on conduction indices (energy unit).</summary>
    public ReadOnlySpan<double> Levels => _levels;
    /// <summary>Shell group of each basis index (index into <see cref="BoundModel.ShellGroups"/>), -1 for conduction.</summary>
    public ReadOnlySpan<int> GroupOfBasis => _groupOfBasis;
    public int GroupCount { get; }

    public BlochHamiltonian(BoundModel model)
    {
        Model = model; _f = model.Flavours; _n = model.BasisSize;
        int m = model.Hoppings.Count;
        _dx = new double[m]; _dy = new double[m]; _dz = new double[m];
        _rowBase = new int[m]; _colBase = new int[m]; _scaled = new bool[m];
        _amp = new Complex[m * _f * _f];
        for (int t = 0; t < m; t++)
        {
            var h = model.Hoppings[t];
            var d = model.Lattice.LatticeVector(h.R.N1, h.R.N2, h.R.N3)
                    + model.Sites[model.Orbitals[h.To].Site].Position - model.Sites[model.Orbitals[h.From].Site].Position;
            _dx[t] = d.X; _dy[t] = d.Y; _dz[t] = d.Z;
            _rowBase[t] = h.From * _f; _colBase[t] = h.To * _f;
            _scaled[t] = model.Orbitals[h.From].Kind == OrbitalKind.Correlated || model.Orbitals[h.To].Kind == OrbitalKind.Correlated;
            h.Amplitude.Elements.CopyTo(_amp.AsSpan(t * _f * _f, _f * _f));
        }
        _onsite = new Complex[_n * _n];
        foreach (var o in model.Onsite)
            for (int a = 0; a < _f; a++)
                for (int b = 0; b < _f; b++)
                    _onsite[(o.Orbital * _f + a) * _n + o.Orbital * _f + b] += o.Amplitude[a, b];
        _levels = new double[_n];
        _groupOfBasis = new int[_n];
        Array.Fill(_groupOfBasis, -1);
        var groups = model.ShellGroups();
        GroupCount = groups.Count;
        foreach (var s in model.Shells)
        {
            int g = IndexOf(groups, s.Group);
            for (int a = 0; a < _f; a++) { _levels[s.Orbital * _f + a] = s.Level; _groupOfBasis[s.Orbital * _f + a] = g; }
        }
    }

    private static int IndexOf(IReadOnlyList<string> list, string value)
    {
        for (int i = 0; i < list.Count; i++) if (list[i] == value) return i;
        return -1;
    }

    /// <summary>
    /// Writes the fixed and the scaled parts of H(k) (row-major, Size x Size each, overwritten).
    /// <paramref name="k"/> is Cartesian in inverse angstrom.
    /// </summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // hot loop: skip tier-0 code
    public void AssembleParts(Vec3 k, Span<Complex> fixedPart, Span<Complex> scaledPart)
    {
        int n = _n, f = _f;
        _onsite.AsSpan().CopyTo(fixedPart);
        scaledPart[..(n * n)].Clear();
        for (int t = 0; t < _dx.Length; t++)
        {
            var (s, c) = Math.SinCos(k.X * _dx[t] + k.Y * _dy[t] + k.Z * _dz[t]);
            var phase = new Complex(c, s);
            var target = _scaled[t] ? scaledPart : fixedPart;
            int r0 = _rowBase[t], c0 = _colBase[t], a0 = t * f * f;
            for (int a = 0; a < f; a++)
                for (int b = 0; b < f; b++)
                {
                    var v = _amp[a0 + a * f + b] * phase;
                    target[(r0 + a) * n + c0 + b] += v;
                    target[(c0 + b) * n + r0 + a] += Complex.Conjugate(v);
                }
        }
    }

    /// <summary>The bare H(k): fixed part + scaled part + shell levels on the diagonal. <paramref name="scratch"/> holds Size*Size.</summary>
    public void Assemble(Vec3 k, Span<Complex> h, Span<Complex> scratch)
    {
        AssembleParts(k, h, scratch);
        for (int i = 0; i < _n * _n; i++) h[i] += scratch[i];
        for (int i = 0; i < _n; i++) h[i * _n + i] += _levels[i];
    }

    /// <summary>Largest |H_ij - conj(H_ji)| over <paramref name="samples"/> pseudo-random k-points (fixed seed).</summary>
    public double HermiticityDefect(int samples = 16, int seed = 12345)
    {
        var rng = new Random(seed);
        var h = new Complex[_n * _n];
        var scratch = new Complex[_n * _n];
        double worst = 0;
        for (int s = 0; s < samples; s++)
        {
            var k = Model.Lattice.Cartesian(rng.NextDouble(), rng.NextDouble(), Model.Lattice.Dimension >= 3 ? rng.NextDouble() : 0);
            Assemble(k, h, scratch);
            for (int i = 0; i < _n; i++)
                for (int j = 0; j <= i; j++)
                    worst = Math.Max(worst, Complex.Abs(h[i * _n + j] - Complex.Conjugate(h[j * _n + i])));
        }
        return worst;
    }
}
