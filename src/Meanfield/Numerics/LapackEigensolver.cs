using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Meanfield.Numerics;

/// <summary>
/// Complex Hermitian eigensolver through LAPACK zheevd (divide and conquer), for large matrices. Prefers Debian's
/// OpenBLAS (libopenblas.so.0, pinned to one thread since callers parallelise outside), else reference liblapack.so.3.
/// Workspace is queried once (lwork = -1) and allocated in the constructor; one instance per thread.
/// </summary>
/// <remarks>
/// All arrays handed to LAPACK live in one 64-byte-aligned block on the pinned object heap: OpenBLAS's complex
/// kernels (zgemv_n_HASWELL) crash on the 8-byte alignment that .NET gives Complex[] data (measured here).
/// </remarks>
public sealed unsafe class LapackEigensolver : IHermitianEigensolver
{
    private const int Alignment = 64;
    private static readonly Lazy<string?> Library = new(Probe);

    private readonly bool _openBlas;
    private readonly byte[] _block;   // pinned for the solver's lifetime; the pointers below point into it
    private readonly Complex* _a;
    private readonly double* _w;
    private readonly Complex* _work;
    private readonly double* _rwork;
    private readonly int* _iwork;
    private readonly int _lwork, _lrwork, _liwork;

    /// <exception cref="PlatformNotSupportedException">When neither library provides zheevd_ (see <see cref="IsAvailable"/>).</exception>
    public LapackEigensolver(int size)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(size, 1);
        _openBlas = Library.Value switch
        {
            LapackNative.OpenBlas => true,
            LapackNative.ReferenceLapack => false,
            _ => throw new PlatformNotSupportedException(
                $"LAPACK zheevd_ not found in {LapackNative.OpenBlas} or {LapackNative.ReferenceLapack} (Debian: apt-get install libopenblas0-pthread)."),
        };
        Size = size;
        int n = size;

        var query = GC.AllocateArray<byte>(64 + 2 * Alignment, pinned: true);
        byte* q = Align((byte*)Unsafe.AsPointer(ref MemoryMarshal.GetArrayDataReference(query)));
        int info = Call(_openBlas, (byte)'V', n, (Complex*)q, (double*)(q + 16), (Complex*)(q + 32), -1,
            (double*)(q + 48), -1, (int*)(q + 56), -1);
        if (info != 0) throw new InvalidOperationException($"zheevd workspace query failed, info = {info}.");
        // The documented minima for jobz = 'V' guard against a library that under-reports.
        _lwork = Math.Max((int)((Complex*)(q + 32))->Real, 2 * n + n * n);
        _lrwork = Math.Max((int)*(double*)(q + 48), 1 + 5 * n + 2 * n * n);
        _liwork = Math.Max(*(int*)(q + 56), 3 + 5 * n);

        long aBytes = Round(16L * n * n), wBytes = Round(8L * n), workBytes = Round(16L * _lwork), rworkBytes = Round(8L * _lrwork);
        long total = aBytes + wBytes + workBytes + rworkBytes + Round(4L * _liwork) + Alignment;
        _block = GC.AllocateArray<byte>(checked((int)total), pinned: true);
        byte* p = Align((byte*)Unsafe.AsPointer(ref MemoryMarshal.GetArrayDataReference(_block)));
        _a = (Complex*)p; p += aBytes;
        _w = (double*)p; p += wBytes;
        _work = (Complex*)p; p += workBytes;
        _rwork = (double*)p; p += rworkBytes;
        _iwork = (int*)p;
    }

    /// <summary>Whether zheevd_ could be loaded from OpenBLAS or reference LAPACK.</summary>
    public static bool IsAvailable => Library.Value is not null;

    /// <summary>File name of the library in use ("libopenblas.so.0" or "liblapack.so.3"), or null.</summary>
    public static string? LibraryName => Library.Value;

    public int Size { get; }

    /// <remarks>
    /// LAPACK is column-major: the row-major Hermitian A reads as A^T = conj(A). Its eigenvectors come back as conj(v)
    /// in columns, i.e. buffer[m*n + i] = conj(v_m[i]); we transpose and conjugate (common practice).
    /// </remarks>
    public void Solve(Span<Complex> matrix, Span<double> values, Span<Complex> vectors)
    {
        int n = Size;
        bool wantVectors = EigenArguments.Check(n, matrix, values, vectors);

        var a = new Span<Complex>(_a, n * n);
        matrix[..(n * n)].CopyTo(a);
        int info = Call(_openBlas, wantVectors ? (byte)'V' : (byte)'N', n, _a, _w, _work, _lwork, _rwork, _lrwork, _iwork, _liwork);
        GC.KeepAlive(_block);
        if (info != 0) throw new InvalidOperationException($"zheevd failed for n = {n}, info = {info}.");
        new ReadOnlySpan<double>(_w, n).CopyTo(values);
        if (!wantVectors) return;
        for (int i = 0; i < n; i++)
            for (int m = 0; m < n; m++)
                vectors[i * n + m] = Complex.Conjugate(a[m * n + i]);
    }

    private static long Round(long bytes) => (bytes + Alignment - 1) / Alignment * Alignment;

    private static byte* Align(byte* p) => (byte*)(((nint)p + Alignment - 1) & ~(nint)(Alignment - 1));

    private static int Call(bool openBlas, byte jobz, int n, Complex* a, double* w,
        Complex* work, int lwork, double* rwork, int lrwork, int* iwork, int liwork)
    {
        byte uplo = (byte)'U';   // upper of the column-major view = lower of our row-major storage; either is complete
        int lda = n, info = 0;
        if (openBlas)
            LapackNative.FromOpenBlas.Zheevd(&jobz, &uplo, &n, a, &lda, w, work, &lwork, rwork, &lrwork, iwork, &liwork, &info, 1, 1);
        else
            LapackNative.FromReferenceLapack.Zheevd(&jobz, &uplo, &n, a, &lda, w, work, &lwork, rwork, &lrwork, iwork, &liwork, &info, 1, 1);
        return info;
    }

    private static string? Probe()
    {
        try
        {
            LapackNative.FromOpenBlas.SetNumThreads(1);
            if (TryTinySolve(openBlas: true)) return LapackNative.OpenBlas;
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException or BadImageFormatException) { }
        try
        {
            if (TryTinySolve(openBlas: false)) return LapackNative.ReferenceLapack;
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException or BadImageFormatException) { }
        return null;
    }

    /// <summary>Loads the entry point by solving a 1x1 problem; binding happens on first call.</summary>
    private static bool TryTinySolve(bool openBlas)
    {
        Complex a = new(2.5, 0), work = default;
        double w = 0, rwork = 0;
        int iwork = 0;
        return Call(openBlas, (byte)'N', 1, &a, &w, &work, 1, &rwork, 1, &iwork, 1) == 0 && w == 2.5;
    }
}
