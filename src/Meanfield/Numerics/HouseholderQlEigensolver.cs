using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Meanfield.Numerics;

/// <summary>
/// Allocation-free (after construction) eigensolver for small dense complex Hermitian matrices, the per-k workhorse of
/// Brillouin-zone sums. Householder reduction to a tridiagonal matrix, a diagonal phase transform that makes it real
/// symmetric, implicit QL with Wilkinson shifts accumulating real plane rotations, then back-transformation.
/// One instance per thread.
/// </summary>
/// <remarks>
/// Wilkinson &amp; Reinsch, Handbook for Automatic Computation vol. II (1971), tred2/tql2 (complex form: htridi/htribk);
/// Golub &amp; Van Loan, Matrix Computations, 4th ed. (2013), Sec. 8.3 (Householder tridiagonalization, symmetric QR;
/// algorithm numbers from memory).
/// Entries are assumed within about 1e-150..1e150 in magnitude (plain sqrt(a^2+b^2) in the rotations).
/// </remarks>
public sealed class HouseholderQlEigensolver : IHermitianEigensolver
{
    private const int MaxSweepsPerEigenvalue = 60;

    private readonly double[] _diag;          // tridiagonal diagonal, then eigenvalues
    private readonly double[] _off;           // real off-diagonal: _off[i] couples i and i+1
    private readonly Complex[] _sub;          // complex sub-diagonal T_{k+1,k} of the Householder tridiagonal
    private readonly Complex[] _phase;        // D in T = D T' D^H (T' real symmetric)
    private readonly double[] _beta;          // Householder scale 2 / (v^H v); 0 means no reflector
    private readonly Complex[] _p;            // reduction work vector (also used in back-transformation)
    private readonly double[] _rot;           // rows are the eigenvectors of T' (row-major, contiguous rotations)

    public HouseholderQlEigensolver(int size)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(size, 1);
        Size = size;
        _diag = new double[size];
        _off = new double[size];
        _sub = new Complex[size];
        _phase = new Complex[size];
        _beta = new double[size];
        _p = new Complex[size];
        _rot = new double[size * size];
    }

    public int Size { get; }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]   // hot kernel: skip tier-0 code
    public void Solve(Span<Complex> matrix, Span<double> values, Span<Complex> vectors)
    {
        int n = Size;
        bool wantVectors = EigenArguments.Check(n, matrix, values, vectors);

        Tridiagonalize(matrix);
        MakeOffDiagonalReal(matrix);
        if (wantVectors)
        {
            Array.Clear(_rot);
            for (int i = 0; i < n; i++) _rot[i * n + i] = 1.0;
        }
        ImplicitQl(wantVectors);
        SortAscending(wantVectors);
        _diag.AsSpan(0, n).CopyTo(values);
        if (wantVectors) BackTransform(matrix, vectors);
    }

    /// <summary>
    /// A -> H_{n-3}...H_0 A H_0...H_{n-3}, lower triangle only; reflector k is kept in column k below the sub-diagonal.
    /// Update B' = B - v w^H - w v^H with p = beta B v, w = p - (beta/2)(v^H p) v (Golub &amp; Van Loan, Alg. 8.3.1).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Tridiagonalize(Span<Complex> a)
    {
        int n = Size;
        Span<Complex> p = _p;
        for (int k = 0; k < n - 2; k++)
        {
            int m = n - k - 1;
            int first = (k + 1) * n + k;
            double tail = 0;
            for (int i = 1; i < m; i++) tail += Norm2(a[first + i * n]);
            if (tail == 0) { _beta[k] = 0; _sub[k] = a[first]; continue; }

            Complex alpha = a[first];
            double absAlpha = Complex.Abs(alpha);
            double sigma = Math.Sqrt(absAlpha * absAlpha + tail);
            Complex phase = absAlpha == 0 ? Complex.One : alpha / absAlpha;
            Complex v0 = alpha + phase * sigma;          // sign choice avoids cancellation
            double beta = 2.0 / (Norm2(v0) + tail);
            _beta[k] = beta;
            a[first] = v0;
            _sub[k] = -phase * sigma;

            // p = beta * B v with B Hermitian, B = A[k+1.., k+1..] read from its lower triangle.
            for (int i = 0; i < m; i++) p[i] = Complex.Zero;
            for (int i = 0; i < m; i++)
            {
                int row = (k + 1 + i) * n + k + 1;
                Complex vi = a[first + i * n];
                double accRe = 0, accIm = 0;
                for (int j = 0; j < i; j++)
                {
                    Complex b = a[row + j];
                    Complex vj = a[first + j * n];
                    accRe += b.Real * vj.Real - b.Imaginary * vj.Imaginary;
                    accIm += b.Real * vj.Imaginary + b.Imaginary * vj.Real;
                    // conj(b) * vi
                    p[j] += new Complex(b.Real * vi.Real + b.Imaginary * vi.Imaginary, b.Real * vi.Imaginary - b.Imaginary * vi.Real);
                }
                double d = a[row + i].Real;
                p[i] += new Complex(accRe + d * vi.Real, accIm + d * vi.Imaginary);
            }
            double vHp = 0;
            for (int i = 0; i < m; i++)
            {
                p[i] *= beta;
                Complex vi = a[first + i * n];
                vHp += vi.Real * p[i].Real + vi.Imaginary * p[i].Imaginary;
            }
            double kScale = 0.5 * beta * vHp;
            for (int i = 0; i < m; i++) p[i] -= kScale * a[first + i * n];   // p now holds w

            for (int i = 0; i < m; i++)
            {
                int row = (k + 1 + i) * n + k + 1;
                Complex vi = a[first + i * n];
                Complex wi = p[i];
                for (int j = 0; j <= i; j++)
                {
                    Complex vj = a[first + j * n];
                    Complex wj = p[j];
                    // v_i conj(w_j) + w_i conj(v_j)
                    double re = vi.Real * wj.Real + vi.Imaginary * wj.Imaginary + wi.Real * vj.Real + wi.Imaginary * vj.Imaginary;
                    double im = vi.Imaginary * wj.Real - vi.Real * wj.Imaginary + wi.Imaginary * vj.Real - wi.Real * vj.Imaginary;
                    a[row + j] -= new Complex(re, im);
                }
            }
        }
    }

    /// <summary>
    /// Complex tridiagonal T -> real symmetric T' = D^H T D with D = diag(phase), phase_{k+1} = phase_k t_k/|t_k|,
    /// so T'_{k+1,k} = |t_k| (common practice; the phases go into the eigenvectors).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void MakeOffDiagonalReal(Span<Complex> a)
    {
        int n = Size;
        for (int k = 0; k < n; k++) _diag[k] = a[k * n + k].Real;
        if (n >= 2) _sub[n - 2] = a[(n - 1) * n + n - 2];
        _phase[0] = Complex.One;
        for (int k = 0; k < n - 1; k++)
        {
            Complex t = _sub[k];
            double abs = Complex.Abs(t);
            _off[k] = abs;
            _phase[k + 1] = abs == 0 ? _phase[k] : _phase[k] * (t / abs);
        }
        _off[n - 1] = 0;
    }

    /// <summary>Implicit QL with Wilkinson shift on the real tridiagonal (_diag, _off) (Wilkinson &amp; Reinsch, tql2).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void ImplicitQl(bool wantVectors)
    {
        int n = Size;
        double[] d = _diag, e = _off, z = _rot;
        for (int l = 0; l < n; l++)
        {
            int sweeps = 0;
            int m;
            do
            {
                for (m = l; m < n - 1; m++)
                {
                    double dd = Math.Abs(d[m]) + Math.Abs(d[m + 1]);
                    if (Math.Abs(e[m]) + dd == dd) break;   // negligible at working precision
                }
                if (m == l) break;
                if (++sweeps > MaxSweepsPerEigenvalue)
                    throw new InvalidOperationException($"Implicit QL did not converge for eigenvalue {l} of {n}.");

                double g = (d[l + 1] - d[l]) / (2.0 * e[l]);
                double r = Math.Sqrt(g * g + 1.0);
                g = d[m] - d[l] + e[l] / (g + (g >= 0 ? r : -r));   // Wilkinson shift from the leading 2x2 block
                double s = 1.0, c = 1.0, p = 0.0;
                int i;
                for (i = m - 1; i >= l; i--)
                {
                    double f = s * e[i], b = c * e[i];
                    r = Math.Sqrt(f * f + g * g);
                    e[i + 1] = r;
                    if (r == 0.0)
                    {
                        d[i + 1] -= p;
                        e[m] = 0.0;
                        break;
                    }
                    s = f / r;
                    c = g / r;
                    g = d[i + 1] - p;
                    r = (d[i] - g) * s + 2.0 * c * b;
                    p = s * r;
                    d[i + 1] = g + p;
                    g = c * r - b;
                    if (wantVectors) Rotate(z.AsSpan(i * n, n), z.AsSpan((i + 1) * n, n), c, s);
                }
                if (r == 0.0 && i >= l) continue;
                d[l] -= p;
                e[l] = g;
                e[m] = 0.0;
            } while (m != l);
        }
    }

    /// <summary>Plane rotation of two eigenvector rows (contiguous, so SIMD-friendly).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Rotate(Span<double> lower, Span<double> upper, double c, double s)
    {
        int k = 0;
        if (Vector.IsHardwareAccelerated && lower.Length >= Vector<double>.Count)
        {
            var vc = new Vector<double>(c);
            var vs = new Vector<double>(s);
            var lo = MemoryMarshal.Cast<double, Vector<double>>(lower);
            var up = MemoryMarshal.Cast<double, Vector<double>>(upper);
            for (int v = 0; v < lo.Length; v++)
            {
                var f = up[v];
                up[v] = vs * lo[v] + vc * f;
                lo[v] = vc * lo[v] - vs * f;
            }
            k = lo.Length * Vector<double>.Count;
        }
        for (; k < lower.Length; k++)
        {
            double f = upper[k];
            upper[k] = s * lower[k] + c * f;
            lower[k] = c * lower[k] - s * f;
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void SortAscending(bool wantVectors)
    {
        int n = Size;
        for (int i = 0; i < n - 1; i++)
        {
            int min = i;
            for (int j = i + 1; j < n; j++) if (_diag[j] < _diag[min]) min = j;
            if (min == i) continue;
            (_diag[i], _diag[min]) = (_diag[min], _diag[i]);
            if (wantVectors)
                for (int k = 0; k < n; k++)
                    (_rot[i * n + k], _rot[min * n + k]) = (_rot[min * n + k], _rot[i * n + k]);
        }
    }

    /// <summary>Eigenvectors of A = H_0...H_{n-3} D z, reflectors applied last-to-first.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void BackTransform(Span<Complex> a, Span<Complex> x)
    {
        int n = Size;
        for (int i = 0; i < n; i++)
        {
            Complex ph = _phase[i];
            for (int m = 0; m < n; m++) x[i * n + m] = ph * _rot[m * n + i];
        }
        Span<Complex> s = _p;
        for (int k = n - 3; k >= 0; k--)
        {
            double beta = _beta[k];
            if (beta == 0) continue;
            int first = (k + 1) * n + k;
            s.Clear();
            for (int i = k + 1; i < n; i++)
            {
                Complex cv = Complex.Conjugate(a[first + (i - k - 1) * n]);
                var row = x.Slice(i * n, n);
                for (int m = 0; m < n; m++) s[m] += cv * row[m];
            }
            for (int i = k + 1; i < n; i++)
            {
                Complex bv = beta * a[first + (i - k - 1) * n];
                var row = x.Slice(i * n, n);
                for (int m = 0; m < n; m++) row[m] -= bv * s[m];
            }
        }
    }

    private static double Norm2(Complex z) => z.Real * z.Real + z.Imaginary * z.Imaginary;
}
