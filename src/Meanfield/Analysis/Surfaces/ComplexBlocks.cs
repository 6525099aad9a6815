using System.Numerics;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// Dense complex n x n block arithmetic on caller buffers (row-major), allocation-free: the kernels of the decimation.
/// </summary>
internal static class ComplexBlocks
{
    /// <summary>c = a b.</summary>
    public static void Multiply(int n, ReadOnlySpan<Complex> a, ReadOnlySpan<Complex> b, Span<Complex> c)
    {
        c[..(n * n)].Clear();
        MultiplyAdd(n, a, b, c);
    }

    /// <summary>c += a b.</summary>
    public static void MultiplyAdd(int n, ReadOnlySpan<Complex> a, ReadOnlySpan<Complex> b, Span<Complex> c)
    {
        for (int i = 0; i < n; i++)
        {
            var ci = c.Slice(i * n, n);
            for (int k = 0; k < n; k++)
            {
                var aik = a[i * n + k];
                if (aik == Complex.Zero) continue;
                var bk = b.Slice(k * n, n);
                double ar = aik.Real, ai = aik.Imaginary;
                for (int j = 0; j < n; j++)
                {
                    var bkj = bk[j];
                    ci[j] += new Complex(ar * bkj.Real - ai * bkj.Imaginary, ar * bkj.Imaginary + ai * bkj.Real);
                }
            }
        }
    }

    /// <summary>b = a^dagger.</summary>
    public static void Adjoint(int n, ReadOnlySpan<Complex> a, Span<Complex> b)
    {
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++) b[j * n + i] = Complex.Conjugate(a[i * n + j]);
    }

    /// <summary>
    /// inv = a^-1 by Gauss-Jordan elimination with partial pivoting; <paramref name="a"/> is destroyed.
    /// Returns false when a pivot vanishes (the matrix is singular to working precision).
    /// </summary>
    public static bool Invert(int n, Span<Complex> a, Span<Complex> inv)
    {
        inv[..(n * n)].Clear();
        for (int i = 0; i < n; i++) inv[i * n + i] = Complex.One;
        for (int c = 0; c < n; c++)
        {
            int p = c;
            double best = Magnitude2(a[c * n + c]);
            for (int r = c + 1; r < n; r++)
            {
                double m = Magnitude2(a[r * n + c]);
                if (m > best) { best = m; p = r; }
            }
            if (best == 0 || !double.IsFinite(best)) return false;
            if (p != c)
            {
                SwapRows(a, c, p, n); SwapRows(inv, c, p, n);
            }
            var pivot = Complex.One / a[c * n + c];
            var rowA = a.Slice(c * n, n); var rowI = inv.Slice(c * n, n);
            for (int j = 0; j < n; j++) { rowA[j] *= pivot; rowI[j] *= pivot; }
            for (int r = 0; r < n; r++)
            {
                if (r == c) continue;
                var f = a[r * n + c];
                if (f == Complex.Zero) continue;
                var ra = a.Slice(r * n, n); var ri = inv.Slice(r * n, n);
                for (int j = 0; j < n; j++) { ra[j] -= f * rowA[j]; ri[j] -= f * rowI[j]; }
            }
        }
        return true;
    }

    // Row swap element by element (no temporary buffer).
    private static void SwapRows(Span<Complex> m, int r1, int r2, int n)
    {
        for (int j = 0; j < n; j++) (m[r1 * n + j], m[r2 * n + j]) = (m[r2 * n + j], m[r1 * n + j]);
    }

    private static double Magnitude2(Complex z) => z.Real * z.Real + z.Imaginary * z.Imaginary;

    /// <summary>Largest |element| of an n x n block.</summary>
    public static double MaxAbs(int n, ReadOnlySpan<Complex> a)
    {
        double m = 0;
        for (int i = 0; i < n * n; i++) m = Math.Max(m, Math.Abs(a[i].Real) + Math.Abs(a[i].Imaginary));
        return m;
    }
}
