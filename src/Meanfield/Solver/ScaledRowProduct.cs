using System.Numerics;
using System.Runtime.CompilerServices;

namespace Meanfield.Solver;

/// <summary>The one kernel of the boson-scaled product (S G V)_{i c} = sum_j S_ij g_j V_jc, shared by the state projection and the Jacobian sums.</summary>
internal static class ScaledRowProduct
{
    /// <summary>
    /// sum_j s[row + j] * (scale[j] * v[j * n + column]) for j &lt; n. Written out, because the JIT does not inline
    /// Complex's operators into methods compiled at full optimisation straight away; the same operations in the same
    /// order as the operator form, so the same bits.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static Complex At(ReadOnlySpan<Complex> s, int row, ReadOnlySpan<Complex> v, int column, int n, ReadOnlySpan<double> scale)
    {
        double re = 0, im = 0;
        for (int j = 0; j < n; j++)
        {
            var vj = v[j * n + column]; double gj = scale[j];
            double xr = gj * vj.Real, xi = gj * vj.Imaginary;
            var sij = s[row + j];
            re += sij.Real * xr - sij.Imaginary * xi;
            im += sij.Imaginary * xr + sij.Real * xi;
        }
        return new Complex(re, im);
    }
}
