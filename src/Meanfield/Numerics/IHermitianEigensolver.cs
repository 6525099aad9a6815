using System.Numerics;

namespace Meanfield.Numerics;

/// <summary>
/// Eigen-decomposition of a dense complex Hermitian matrix stored row-major.
/// Implementations are single-threaded and hold their own workspace: use one instance per thread.
/// </summary>
public interface IHermitianEigensolver
{
    /// <summary>Matrix dimension this instance was built for.</summary>
    int Size { get; }

    /// <summary>
    /// Eigenvalues in ascending order into <paramref name="values"/>; when <paramref name="vectors"/> is not empty, the
    /// normalized eigenvectors as its columns (row-major, vectors[i * n + m] = component i of eigenvector m).
    /// <paramref name="matrix"/> may be overwritten.
    /// </summary>
    void Solve(Span<Complex> matrix, Span<double> values, Span<Complex> vectors);
}
