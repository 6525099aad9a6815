using System.Numerics;
using Meanfield.Numerics;

namespace Meanfield.Solver;

/// <summary>
/// Per-thread accumulator of the analytic Jacobian of the saddle-point sums from one set of eigenstates. For a sum
/// A = sum_s f(E_s - mu) &lt;s|A|s&gt; and a parameter x of H (Hellmann-Feynman plus first-order eigenvector change;
/// e.g. Giustino, Materials Modelling Using Density Functional Theory (2014), ch. 10, the static linear-response sum):
///   dA/dx = sum_s f_s &lt;s|dA/dx|s&gt; + sum_{s,t} L_st Re(A_st (dH/dx)_ts) + (dmu/dx) sum_s (-f'_s) A_ss,
///   L_st = (f_s - f_t) / (E_s - E_t), L_ss = f'(E_s),   dmu/dx = sum (-f') (dH/dx)_ss / sum (-f')  (N fixed).
/// The operators are A in {P_g, D_g} and dH/dx in {D_h (x = r_h), P_h (x = lambda_h)}, with P_g the projector on group
/// g's f components and D_g = dH_MF/dr_g = P_g S G + G S P_g; dD_g/dr_h = P_g S P_h + P_h S P_g.
/// </summary>
internal sealed class StateDerivatives
{
    /// <summary>Below this energy difference (relative to T) the divided difference of f is replaced by f' at the midpoint (error ~ (dE/T)^2).</summary>
    private const double DegenerateFraction = 1e-5;

    private readonly int _n, _g, _m;
    private readonly int[] _fIndex, _fGroup;
    private readonly bool _ffBonds;
    private readonly Complex[] _ops, _w;
    private readonly double[] _f, _d;
    /// <summary>sum L Re(M_a M_b), 2G x 2G.</summary>
    public readonly double[] Pair;
    /// <summary>sum (-f') Re M_a,ss, 2G.</summary>
    public readonly double[] Mean;
    /// <summary>sum f &lt;s|P_g S P_h + P_h S P_g|s&gt;, G x G.</summary>
    public readonly double[] Second;
    /// <summary>sum (-f').</summary>
    public double SumD;

    public StateDerivatives(int n, int groups, int[] fIndex, int[] fGroup, bool ffBonds)
    {
        _n = n; _g = groups; _m = 2 * groups; _fIndex = fIndex; _fGroup = fGroup; _ffBonds = ffBonds;
        _ops = new Complex[_m * n * n]; _w = new Complex[fIndex.Length * n];
        _f = new double[n]; _d = new double[n];
        Pair = new double[_m * _m]; Mean = new double[_m]; Second = new double[groups * groups];
    }

    public void Clear()
    {
        Array.Clear(Pair); Array.Clear(Mean); Array.Clear(Second); SumD = 0;
    }

    /// <summary>Adds one k-point (or DOS node) of weight <paramref name="weight"/>: energies, eigenvectors (columns), bare S, boson scales.</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // hot loop: skip tier-0 code
    public void Add(double weight, ReadOnlySpan<double> e, ReadOnlySpan<Complex> v, ReadOnlySpan<Complex> s, ReadOnlySpan<double> scale,
                    double mu, double t)
    {
        int n = _n, nn = n * n, g = _g, m = _m;
        for (int a = 0; a < n; a++)
        {
            double x = e[a] - mu;
            // Beyond |x| = 746 T the exponentials are 0 in doubles: the same values without libm's slow underflow path.
            if (t > 0 && Math.Abs(x / t) > 746) { _f[a] = x < 0 ? 1 : 0; _d[a] = 0; continue; }
            _f[a] = FermiDirac.Occupation(x, t); _d[a] = FermiDirac.NegativeDerivative(x, t);
        }
        // W_it = (S G V)_it on the f rows only (D_g needs no other rows).
        for (int q = 0; q < _fIndex.Length; q++)
        {
            int row = _fIndex[q] * n;
            for (int c = 0; c < n; c++)
            {
                _w[q * n + c] = ScaledRowProduct.At(s, row, v, c, n, scale);
            }
        }
        var ops = _ops.AsSpan();
        ops.Clear();
        for (int q = 0; q < _fIndex.Length; q++)
        {
            int i = _fIndex[q], grp = _fGroup[q], row = i * n;
            int pBase = grp * nn, dBase = (g + grp) * nn;
            for (int a = 0; a < n; a++)
            {
                var via = Complex.Conjugate(v[row + a]);
                var wia = Complex.Conjugate(_w[q * n + a]);
                for (int b = a; b < n; b++)
                {
                    ops[pBase + a * n + b] += via * v[row + b];
                    ops[dBase + a * n + b] += via * _w[q * n + b] + wia * v[row + b];
                }
            }
        }
        double sumD = 0;
        for (int a = 0; a < n; a++)
        {
            sumD += _d[a];
            for (int x = 0; x < m; x++) Mean[x] += weight * _d[a] * ops[x * nn + a * n + a].Real;
        }
        SumD += weight * sumD;
        double window = DegenerateFraction * t;
        for (int a = 0; a < n; a++)
            for (int b = a; b < n; b++)
            {
                double l;
                if (a == b) l = -_d[a];
                else
                {
                    double de = e[a] - e[b];
                    if (Math.Abs(de) <= window) l = -FermiDirac.NegativeDerivative(0.5 * (e[a] + e[b]) - mu, t);
                    else if (_f[a] == _f[b]) l = t > 0 ? (_f[a] - _f[b]) / de : 0;
                    else l = (_f[a] - _f[b]) / de;
                    l *= 2; // the pair (b, a) contributes the same
                }
                if (l == 0) continue;
                l *= weight;
                int ab = a * n + b;
                for (int x = 0; x < m; x++)
                {
                    var mx = ops[x * nn + ab];
                    for (int y = x; y < m; y++)
                    {
                        var my = ops[y * nn + ab];
                        Pair[x * m + y] += l * (mx.Real * my.Real + mx.Imaginary * my.Imaginary);
                    }
                }
            }
        if (!_ffBonds) return;
        for (int a = 0; a < n; a++)
        {
            if (_f[a] == 0) continue;
            for (int p = 0; p < _fIndex.Length; p++)
                for (int q = 0; q < _fIndex.Length; q++)
                {
                    int i = _fIndex[p], j = _fIndex[q];
                    var sij = s[i * n + j];
                    if (sij == Complex.Zero) continue;
                    var z = Complex.Conjugate(v[i * n + a]) * sij * v[j * n + a];
                    // <a| P_g S P_h + P_h S P_g |a> = 2 Re(conj(V_ia) S_ij V_ja) summed over i in g, j in h (and g, h swapped).
                    Second[_fGroup[p] * g + _fGroup[q]] += weight * _f[a] * z.Real;
                    Second[_fGroup[q] * g + _fGroup[p]] += weight * _f[a] * z.Real;
                }
        }
    }

    /// <summary>Adds another accumulator (threads).</summary>
    public void Merge(StateDerivatives other)
    {
        for (int i = 0; i < Pair.Length; i++) Pair[i] += other.Pair[i];
        for (int i = 0; i < Mean.Length; i++) Mean[i] += other.Mean[i];
        for (int i = 0; i < Second.Length; i++) Second[i] += other.Second[i];
        SumD += other.SumD;
    }

    /// <summary>The 2G x 2G derivatives (rows n_f,g then dOmega/dr_g; columns r_h then lambda_h) from the merged sums.</summary>
    public void Result(double[] result)
    {
        int g = _g, m = _m;
        for (int x = 0; x < m; x++)
            for (int y = 0; y < x; y++) Pair[x * m + y] = Pair[y * m + x];
        for (int row = 0; row < m; row++)
            for (int col = 0; col < m; col++)
            {
                // Row operator: n_f,g -> P_g (index g), dOmega/dr_g -> D_g (index G + g).
                // Column parameter: r_h -> dH/dr_h = D_h (index G + h), lambda_h -> P_h (index h).
                int a = row, b = col < g ? g + col : col - g;
                double v = Pair[a * m + b];
                if (SumD > 0) v += Mean[a] * Mean[b] / SumD;
                if (row >= g && col < g) v += Second[(row - g) * g + col];
                result[row * m + col] = v;
            }
    }
}
