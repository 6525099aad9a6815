using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Renormalization;

namespace Meanfield.Analysis.Responses;

/// <summary>
/// The velocity operators dH/dk_a (a = x, y, z; energy unit x angstrom) of a Bloch source, into caller buffers.
/// Analytic for <see cref="BlochHamiltonian"/> and <see cref="RenormalizedHamiltonian"/> (phases include the site positions: a bond of
/// vector d = R + tau_j - tau_i contributes i d_a t e^{ik.d}, and the mean field multiplies a bond with correlated ends
/// by r_i r_j, so dH_MF/dk = G dH/dk G); by central differences of H(k) for any other source.
/// </summary>
public sealed class VelocityOperator
{
    private readonly IBlochSource _source;
    private readonly int _n, _f;
    private readonly double[] _dx = [], _dy = [], _dz = [], _scale = [];
    private readonly int[] _row = [], _col = [];
    private readonly Complex[] _amp = [];
    private readonly bool _analytic;
    private readonly double _step;

    /// <summary>Prepares the operator for <paramref name="source"/> (bond tables, or the finite-difference step).</summary>
    public VelocityOperator(IBlochSource source)
    {
        _source = source; _n = source.Size; _f = source.Model.Flavours;
        var lat = source.Model.Lattice;
        // Central differences: step 1e-5 of the shortest reciprocal vector balances truncation (step^2) and round-off (eps/step).
        _step = 1e-5 * Math.Min(lat.B1.Norm, Math.Min(lat.B2.Norm, lat.Dimension == 3 ? lat.B3.Norm : double.PositiveInfinity));
        double[]? g = source switch
        {
            BlochHamiltonian => Enumerable.Repeat(1.0, _n).ToArray(),
            RenormalizedHamiltonian r => r.Scale.ToArray(),
            _ => null,
        };
        if (g is null) return;
        _analytic = true; _scale = g;
        var model = source.Model;
        int m = model.Hoppings.Count;
        _dx = new double[m]; _dy = new double[m]; _dz = new double[m];
        _row = new int[m]; _col = new int[m]; _amp = new Complex[m * _f * _f];
        for (int t = 0; t < m; t++)
        {
            var h = model.Hoppings[t];
            var d = lat.LatticeVector(h.R.N1, h.R.N2, h.R.N3)
                    + model.Sites[model.Orbitals[h.To].Site].Position - model.Sites[model.Orbitals[h.From].Site].Position;
            _dx[t] = d.X; _dy[t] = d.Y; _dz[t] = d.Z;
            _row[t] = h.From * _f; _col[t] = h.To * _f;
            h.Amplitude.Elements.CopyTo(_amp.AsSpan(t * _f * _f, _f * _f));
        }
    }

    /// <summary>True when the derivatives are analytic (bond sums), false for finite differences.</summary>
    public bool IsAnalytic => _analytic;

    /// <summary>
    /// Writes dH/dk_x, dH/dk_y, dH/dk_z at the Cartesian k (row-major Size x Size each, overwritten).
    /// <paramref name="scratch"/> holds 3 Size^2 numbers (used by the finite-difference path only).
    /// </summary>
    public void Assemble(Vec3 k, Span<Complex> dx, Span<Complex> dy, Span<Complex> dz, Span<Complex> scratch)
    {
        int n = _n, f = _f, nn = n * n;
        if (!_analytic) { Differences(k, dx, dy, dz, scratch); return; }
        dx[..nn].Clear(); dy[..nn].Clear(); dz[..nn].Clear();
        for (int t = 0; t < _dx.Length; t++)
        {
            var (s, c) = Math.SinCos(k.X * _dx[t] + k.Y * _dy[t] + k.Z * _dz[t]);
            var iphase = new Complex(-s, c);                  // i e^{ik.d}
            int r0 = _row[t], c0 = _col[t], a0 = t * f * f;
            for (int a = 0; a < f; a++)
                for (int b = 0; b < f; b++)
                {
                    int i = r0 + a, j = c0 + b;
                    var v = _scale[i] * _scale[j] * _amp[a0 + a * f + b] * iphase;
                    var vx = _dx[t] * v; var vy = _dy[t] * v; var vz = _dz[t] * v;
                    dx[i * n + j] += vx; dx[j * n + i] += Complex.Conjugate(vx);
                    dy[i * n + j] += vy; dy[j * n + i] += Complex.Conjugate(vy);
                    dz[i * n + j] += vz; dz[j * n + i] += Complex.Conjugate(vz);
                }
        }
    }

    private void Differences(Vec3 k, Span<Complex> dx, Span<Complex> dy, Span<Complex> dz, Span<Complex> scratch)
    {
        int nn = _n * _n;
        Span<Complex> plus = scratch[..nn], minus = scratch.Slice(nn, nn), work = scratch.Slice(2 * nn, nn);
        bool flat = _source.Model.Lattice.Dimension < 3;
        for (int a = 0; a < 3; a++)
        {
            var target = a == 0 ? dx : a == 1 ? dy : dz;
            if (a == 2 && flat) { target[..nn].Clear(); break; }
            var e = a == 0 ? new Vec3(_step, 0, 0) : a == 1 ? new Vec3(0, _step, 0) : new Vec3(0, 0, _step);
            _source.Assemble(k + e, plus, work);
            _source.Assemble(k - e, minus, work);
            for (int i = 0; i < nn; i++) target[i] = (plus[i] - minus[i]) / (2 * _step);
        }
    }
}
