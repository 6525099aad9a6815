using System.Numerics;

namespace Meanfield.Numerics;

/// <summary>The buffer checks every <see cref="IHermitianEigensolver"/> makes before it solves.</summary>
internal static class EigenArguments
{
    /// <summary>Throws when a buffer is too small for an n x n problem; returns whether eigenvectors are wanted.</summary>
    public static bool Check(int n, Span<Complex> matrix, Span<double> values, Span<Complex> vectors)
    {
        if (matrix.Length < n * n) throw new ArgumentException($"matrix needs {n * n} entries, has {matrix.Length}.", nameof(matrix));
        if (values.Length < n) throw new ArgumentException($"values needs {n} entries, has {values.Length}.", nameof(values));
        bool wantVectors = !vectors.IsEmpty;
        if (wantVectors && vectors.Length < n * n)
            throw new ArgumentException($"vectors needs {n * n} entries, has {vectors.Length}.", nameof(vectors));
        return wantVectors;
    }
}
