namespace Meanfield.Numerics;

/// <summary>
/// Which dense linear-algebra code is in use, for provenance in outputs and for `info`. Probed once per process.
/// </summary>
public static class LinearAlgebraBackend
{
    /// <summary>
    /// Matrices of this size or larger go to LAPACK when it is present. Measured on the project machine (2 cores,
    /// December 2026): the managed Householder-QL is faster up to n = 64 and LAPACK zheevd from about n = 96 on.
    /// </summary>
    public const int LargeMatrixThreshold = 96;

    private static readonly Lazy<bool> NativeMathNet = new(() =>
    {
        try { return MathNet.Numerics.Control.TryUseNativeOpenBLAS(); }
        catch (Exception) { return false; }   // a missing native wrapper must never stop a run
    });

    /// <summary>Whether MathNet.Numerics runs on its native OpenBLAS provider (false on Debian: no wrapper library).</summary>
    public static bool MathNetNative => NativeMathNet.Value;

    /// <summary>LAPACK library in use for large matrices, or null.</summary>
    public static string? LapackLibrary => LapackEigensolver.LibraryName;

    /// <summary>One line, e.g. "small matrices: Householder-QL (managed, allocation-free); n >= 96: LAPACK zheevd (libopenblas.so.0); MathNet provider: managed".</summary>
    public static string Description
    {
        get
        {
            string large = LapackLibrary is { } lib ? $"LAPACK zheevd ({lib})" : "MathNet Evd (no LAPACK found)";
            string provider = MathNetNative ? "native OpenBLAS" : "managed";
            return $"small matrices: Householder-QL (managed, allocation-free); n >= {LargeMatrixThreshold}: {large}; MathNet provider: {provider}";
        }
    }
}
