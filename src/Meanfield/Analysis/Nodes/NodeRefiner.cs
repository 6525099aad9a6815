using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Nodes;

/// <summary>Where a refinement ended: the point, its gap, and whether the gap reached the target.</summary>
/// <param name="K">Cartesian wave vector (inverse angstrom).</param>
/// <param name="Gap">E_{lower+1} - E_lower there (energy unit).</param>
/// <param name="Converged">Gap below the target.</param>
/// <param name="Iterations">Gauss-Newton steps taken.</param>
public readonly record struct RefinedPoint(Vec3 K, double Gap, bool Converged, int Iterations);

/// <summary>
/// Refines a band touching by Gauss-Newton on the local effective Hamiltonian. At the current k the bands next to the gap
/// (one band each side, or a Kramers pair each side when they are degenerate) span a subspace P; the traceless part of
/// h(q) = P^dag H(k + q) P vanishes exactly at a touching of those bands. For two bands it is d(q).sigma, so this is
/// Newton on the d-vector of H_eff = e0 + d.sigma, which converges quadratically (Newton's method on a smooth map:
/// common practice; the two-band form near a Weyl point: Herring, Phys. Rev. 52, 365 (1937)), while a minimiser of
/// the gap |d| alone stalls at a gap of the order of the round-off of its comparisons. The derivatives of h come
/// from central differences of H(k), which is smooth in k even where the bands touch.
/// </summary>
/// <remarks>One instance per thread: it owns its buffers and allocates nothing per step.</remarks>
public sealed class NodeRefiner
{
    /// <summary>Most Gauss-Newton steps per refinement.</summary>
    public const int MaxIterations = 40;
    /// <summary>Finite-difference step of dH/dk as a fraction of |b|_min: truncation (step x bond length)^2 ~ 1e-9 of H'.</summary>
    public const double DifferenceStepFraction = 1e-5;
    /// <summary>Largest Gauss-Newton step as a fraction of |b|_min (the linear model is local).</summary>
    public const double MaxStepFraction = 0.05;

    private readonly IBlochSource _source;
    private readonly IHermitianEigensolver _solver;
    private readonly int _n, _dim;
    private readonly Complex[] _h, _scratch, _hSolve, _vectors, _hp;
    private readonly double[] _values;
    private readonly double _step, _maxStep;
    private readonly int[] _subspace = new int[4];
    private readonly double[] _r0 = new double[15], _rp = new double[15], _rm = new double[15], _jac = new double[45];

    /// <summary>A refiner for <paramref name="source"/>; k-steps are scaled by <paramref name="reciprocalLength"/> (|b|_min).</summary>
    /// <exception cref="ArgumentException">A source with fewer than two bands, or a non-positive length.</exception>
    public NodeRefiner(IBlochSource source, double reciprocalLength)
    {
        if (source.Size < 2) throw new ArgumentException("node refinement needs at least two bands");
        if (!(reciprocalLength > 0)) throw new ArgumentException("the reciprocal length must be positive");
        _source = source; _n = source.Size; _dim = source.Model.Lattice.Dimension;
        _solver = Eigensolvers.Create(_n);
        _h = new Complex[_n * _n]; _scratch = new Complex[_n * _n]; _hSolve = new Complex[_n * _n]; _vectors = new Complex[_n * _n];
        _hp = new Complex[16];
        _values = new double[_n];
        _step = DifferenceStepFraction * reciprocalLength;
        _maxStep = MaxStepFraction * reciprocalLength;
    }

    /// <summary>Eigenvalues at the last solved point (ascending).</summary>
    public ReadOnlySpan<double> Values => _values;

    /// <summary>E_{lower+1}(k) - E_lower(k).</summary>
    public double Gap(Vec3 k, int lower)
    {
        Diagonalise(k, false);
        return _values[lower + 1] - _values[lower];
    }

    /// <summary>
    /// Refines from <paramref name="start"/> the touching of bands <paramref name="lower"/> and lower + 1 until the gap
    /// is below <paramref name="targetGap"/>; <paramref name="degeneracy"/> decides when neighbouring bands form Kramers
    /// pairs. Returns the best point reached (not converged when the gap stopped falling or the step cap was hit).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="lower"/> outside 0..Size-2.</exception>
    public RefinedPoint Refine(Vec3 start, int lower, double targetGap, double degeneracy)
    {
        if (lower < 0 || lower + 1 >= _n) throw new ArgumentOutOfRangeException(nameof(lower));
        var k = start;
        double gap = Gap(k, lower);
        int stalls = 0;
        for (int it = 0; it < MaxIterations; it++)
        {
            if (gap < targetGap) return new(k, gap, true, it);
            Diagonalise(k, true);
            int m = Subspace(lower, degeneracy);
            int comps = Residual(_r0, m);
            // Jacobian columns d r / d q_i from central differences of the projected Hamiltonian.
            for (int i = 0; i < _dim; i++)
            {
                var e = Axis(i);
                Project(k + _step * e, m); Residual(_rp, m);
                Project(k - _step * e, m); Residual(_rm, m);
                for (int c = 0; c < comps; c++) _jac[c * 3 + i] = (_rp[c] - _rm[c]) / (2 * _step);
            }
            if (!GaussNewtonStep(comps, out var q)) return new(k, gap, false, it);
            double len = q.Norm;
            if (len > _maxStep) q = q * (_maxStep / len);
            // Backtrack on the true gap: a step is taken only if it lowers it. Slow progress means the minimum is not a
            // touching (Gauss-Newton then creeps towards a least-squares minimum with a finite gap).
            bool accepted = false;
            for (int ls = 0; ls < 12 && !accepted; ls++, q = 0.5 * q)
            {
                var kn = k + q;
                double gn = Gap(kn, lower);
                if (gn < gap)
                {
                    if (gn > 0.5 * gap) stalls++;
                    k = kn; gap = gn; accepted = true;
                }
            }
            if (!accepted || stalls > 6) return new(k, gap, gap < targetGap, it + 1);
        }
        return new(k, gap, gap < targetGap, MaxIterations);
    }

    private static Vec3 Axis(int i) => i switch { 0 => new(1, 0, 0), 1 => new(0, 1, 0), _ => new(0, 0, 1) };

    private void Diagonalise(Vec3 k, bool vectors)
    {
        _source.Assemble(k, _h, _scratch);
        _h.AsSpan().CopyTo(_hSolve);
        _solver.Solve(_hSolve, _values, vectors ? _vectors : Span<Complex>.Empty);
    }

    // The bands spanning the local problem: lower and lower + 1, each widened to its Kramers partner when degenerate.
    private int Subspace(int lower, double degeneracy)
    {
        bool pairBelow = lower >= 1 && _values[lower] - _values[lower - 1] < degeneracy;
        bool pairAbove = lower + 2 < _n && _values[lower + 2] - _values[lower + 1] < degeneracy;
        if (pairBelow && pairAbove)
        {
            _subspace[0] = lower - 1; _subspace[1] = lower; _subspace[2] = lower + 1; _subspace[3] = lower + 2;
            return 4;
        }
        _subspace[0] = lower; _subspace[1] = lower + 1;
        return 2;
    }

    // h = P^dag H(k') P in the eigenbasis P of the current point (eigenvectors are columns of _vectors).
    private void Project(Vec3 k, int m)
    {
        _source.Assemble(k, _h, _scratch);
        for (int a = 0; a < m; a++)
            for (int b = 0; b < m; b++)
            {
                int ca = _subspace[a], cb = _subspace[b];
                Complex s = Complex.Zero;
                for (int i = 0; i < _n; i++)
                {
                    Complex hv = Complex.Zero;
                    for (int j = 0; j < _n; j++) hv += _h[i * _n + j] * _vectors[j * _n + cb];
                    s += Complex.Conjugate(_vectors[i * _n + ca]) * hv;
                }
                _hp[a * m + b] = s;
            }
    }

    // Real components of the traceless part of the current projected block (at q = 0 the block is diagonal).
    private int Residual(double[] r, int m)
    {
        if (ReferenceEquals(r, _r0))
        {
            for (int a = 0; a < m; a++)
                for (int b = 0; b < m; b++) _hp[a * m + b] = a == b ? _values[_subspace[a]] : Complex.Zero;
        }
        double trace = 0;
        for (int a = 0; a < m; a++) trace += _hp[a * m + a].Real;
        trace /= m;
        int c = 0;
        for (int a = 0; a < m; a++)
            for (int b = a + 1; b < m; b++) { r[c++] = _hp[a * m + b].Real; r[c++] = _hp[a * m + b].Imaginary; }
        for (int a = 0; a < m - 1; a++) r[c++] = _hp[a * m + a].Real - trace;
        return c;
    }

    // Least squares: minimise |r0 + J q| over q in the lattice's dimensions (normal equations, at most 3 x 3).
    private bool GaussNewtonStep(int comps, out Vec3 q)
    {
        int d = _dim;
        var a = new double[d * d];
        var rhs = new double[d];
        for (int i = 0; i < d; i++)
        {
            for (int j = 0; j < d; j++)
            {
                double s = 0;
                for (int c = 0; c < comps; c++) s += _jac[c * 3 + i] * _jac[c * 3 + j];
                a[i * d + j] = s;
            }
            double t = 0;
            for (int c = 0; c < comps; c++) t += _jac[c * 3 + i] * _r0[c];
            rhs[i] = -t;
        }
        q = Vec3.Zero;
        if (!DenseSolve.TrySolve(a, rhs, d, out var x)) return false;
        q = new Vec3(x[0], d > 1 ? x[1] : 0, d > 2 ? x[2] : 0);
        return double.IsFinite(q.X) && double.IsFinite(q.Y) && double.IsFinite(q.Z);
    }
}
