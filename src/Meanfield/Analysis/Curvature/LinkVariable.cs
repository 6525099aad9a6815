using System.Numerics;

namespace Meanfield.Analysis.Curvature;

/// <summary>
/// The U(1) link variable of the occupied subspace between two k-points: U = det M with M_mn = &lt;u_m(k1)|u_n(k2)&gt;
/// over the occupied bands m, n &lt; nOcc (Fukui, Hatsugai &amp; Suzuki, J. Phys. Soc. Jpn. 74, 1674 (2005), Eq. 7).
/// Only its phase enters the field strength, so it is not normalized.
/// </summary>
public static class LinkVariable
{
    /// <summary>
    /// det &lt;u(a)|u(b)&gt; for eigenvector blocks stored column-wise (a[i * stride + m] = component i of band m,
    /// i &lt; rows). <paramref name="work"/> holds nOcc * nOcc complex numbers.
    /// </summary>
    public static Complex Overlap(ReadOnlySpan<Complex> a, ReadOnlySpan<Complex> b, int rows, int nOcc, int stride, Span<Complex> work)
    {
        for (int m = 0; m < nOcc; m++)
            for (int p = 0; p < nOcc; p++)
            {
                Complex s = Complex.Zero;
                for (int i = 0; i < rows; i++) s += Complex.Conjugate(a[i * stride + m]) * b[i * stride + p];
                work[m * nOcc + p] = s;
            }
        return Determinant(work, nOcc);
    }

    /// <summary>Determinant by Gaussian elimination with partial pivoting (overwrites the matrix).</summary>
    public static Complex Determinant(Span<Complex> m, int n)
    {
        Complex det = Complex.One;
        for (int c = 0; c < n; c++)
        {
            int piv = c; double best = m[c * n + c].Magnitude;
            for (int r = c + 1; r < n; r++) { double v = m[r * n + c].Magnitude; if (v > best) { best = v; piv = r; } }
            if (best == 0) return Complex.Zero;
            if (piv != c)
            {
                for (int j = 0; j < n; j++) (m[c * n + j], m[piv * n + j]) = (m[piv * n + j], m[c * n + j]);
                det = -det;
            }
            var d = m[c * n + c];
            det *= d;
            for (int r = c + 1; r < n; r++)
            {
                var f = m[r * n + c] / d;
                if (f == Complex.Zero) continue;
                for (int j = c; j < n; j++) m[r * n + j] -= f * m[c * n + j];
            }
        }
        return det;
    }

    /// <summary>
    /// Berry flux (radians) through the plaquette k1 -> k2 -> k3 -> k4, counter-clockwise about its normal:
    /// -arg(U12 U23 U34 U41), the discrete form of the flux of A = i&lt;u|grad u&gt;, folded into (-pi, pi].
    /// </summary>
    public static double PlaquetteFlux(Complex u12, Complex u23, Complex u34, Complex u41) => -(u12 * u23 * u34 * u41).Phase;
}
