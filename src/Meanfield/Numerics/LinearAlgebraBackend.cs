namespace Meanfield.Numerics;

/// <summary>
/// Which dense linear-algebra code is in use, for provenance in outputs and for `info`. Probed once per process.
/// </summary>
public static class LinearAlgebraBackend
{
    /// <summary>
    /// Matrices of this size or larger go to LAPACK when it is present. Measured on the project machine (2 cores,
    /// one thread, eigenvalues and vectors, us per call): n = 32: Householder-QL 105, zheevd 106; n = 40: 204 vs 201;
    /// n = 48: 366 vs 242; n = 64: 824 vs 514. Below 32 the managed solver wins clearly (n = 16: 17 vs 43).
    /// </summary>
    public const int LargeMatrixThreshold = 48;

    private static readonly Lazy<bool> NativeMathNet = new(() =>
    {
        try { return MathNet.Numerics.Control.TryUseNativeOpenBLAS(); }
        catch (Exception) { return false; }   // a missing native wrapper must never stop a run
    });

    /// <summary>Whether MathNet.Numerics runs on its native OpenBLAS provider (false on Debian: no wrapper library).</summary>
    public static bool MathNetNative => NativeMathNet.Value;

    /// <summary>LAPACK library in use for large matrices, or null.</summary>
    public static string? LapackLibrary => LapackEigensolver.LibraryName;

    /// <summary>
    /// One line, e.g. "small matrices: Householder-QL (managed, allocation-free); n >= 48: LAPACK zheevd
    /// (libopenblas.so.0); MathNet provider: managed".
    /// </summary>
    public static string Description
    {
        get
        {
            string provider = MathNetNative ? "native OpenBLAS" : "managed";
            return LapackLibrary is { } lib
                ? $"small matrices: Householder-QL (managed, allocation-free); n >= {LargeMatrixThreshold}: LAPACK zheevd ({lib}); MathNet provider: {provider}"
                : $"all sizes: Householder-QL (managed, allocation-free; no LAPACK found); MathNet provider: {provider}";
        }
    }
}
