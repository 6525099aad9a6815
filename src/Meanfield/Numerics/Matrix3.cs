namespace Meanfield.Numerics;

/// <summary>Kernels for real 3 x 3 matrices stored row-major in 9 numbers.</summary>
public static class Matrix3
{
    /// <summary>Determinant by cofactor expansion along the first row.</summary>
    public static double Determinant(ReadOnlySpan<double> a) =>
        a[0] * (a[4] * a[8] - a[5] * a[7]) - a[1] * (a[3] * a[8] - a[5] * a[6]) + a[2] * (a[3] * a[7] - a[4] * a[6]);

    /// <summary>The inverse (adjugate over determinant) into <paramref name="inverse"/>; false, and nothing written, when the determinant is 0.</summary>
    public static bool TryInvert(ReadOnlySpan<double> a, Span<double> inverse)
    {
        double det = Determinant(a);
        if (det == 0) return false;
        inverse[0] = (a[4] * a[8] - a[5] * a[7]) / det; inverse[1] = (a[2] * a[7] - a[1] * a[8]) / det; inverse[2] = (a[1] * a[5] - a[2] * a[4]) / det;
        inverse[3] = (a[5] * a[6] - a[3] * a[8]) / det; inverse[4] = (a[0] * a[8] - a[2] * a[6]) / det; inverse[5] = (a[2] * a[3] - a[0] * a[5]) / det;
        inverse[6] = (a[3] * a[7] - a[4] * a[6]) / det; inverse[7] = (a[1] * a[6] - a[0] * a[7]) / det; inverse[8] = (a[0] * a[4] - a[1] * a[3]) / det;
        return true;
    }
}
