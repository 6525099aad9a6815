namespace Meanfield.Numerics;

/// <summary>The one place where the eigensolver backend is chosen for a matrix size.</summary>
public static class Eigensolvers
{
    /// <summary>A solver for n x n matrices, owned by one thread.</summary>
    public static IHermitianEigensolver Create(int n) => new MathNetEigensolver(n);

    /// <summary>One line naming the active backend, for `meanfield info` and output provenance.</summary>
    public static string Description => "MathNet.Numerics managed EVD";
}
