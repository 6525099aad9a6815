namespace Meanfield.Numerics;

/// <summary>The one place where the eigensolver backend is chosen for a matrix size.</summary>
public static class Eigensolvers
{
    /// <summary>
    /// A solver for n x n matrices, owned by one thread: the allocation-free Householder-QL below
    /// <see cref="LinearAlgebraBackend.LargeMatrixThreshold"/>, LAPACK zheevd above it, MathNet when LAPACK is missing.
    /// </summary>
    public static IHermitianEigensolver Create(int n)
    {
        if (n < LinearAlgebraBackend.LargeMatrixThreshold) return new HouseholderQlEigensolver(n);
        return LapackEigensolver.IsAvailable ? new LapackEigensolver(n) : new MathNetEigensolver(n);
    }

    /// <summary>One line naming the active backend, for `meanfield info` and output provenance.</summary>
    public static string Description => LinearAlgebraBackend.Description;
}
