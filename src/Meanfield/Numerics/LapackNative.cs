using System.Runtime.InteropServices;

namespace Meanfield.Numerics;

/// <summary>
/// Entry points of LAPACK's zheevd (Fortran calling convention: everything by reference, hidden trailing lengths of
/// the character arguments) in Debian's OpenBLAS and, as fallback, in the reference liblapack.so.3.
/// </summary>
internal static unsafe partial class LapackNative
{
    internal const string OpenBlas = "libopenblas.so.0";
    internal const string ReferenceLapack = "liblapack.so.3";

    internal static partial class FromOpenBlas
    {
        [LibraryImport(OpenBlas, EntryPoint = "zheevd_")]
        internal static partial void Zheevd(byte* jobz, byte* uplo, int* n, void* a, int* lda, double* w,
            void* work, int* lwork, double* rwork, int* lrwork, int* iwork, int* liwork, int* info, nuint jobzLen, nuint uploLen);

        [LibraryImport(OpenBlas, EntryPoint = "openblas_set_num_threads")]
        internal static partial void SetNumThreads(int threads);
    }

    internal static partial class FromReferenceLapack
    {
        [LibraryImport(ReferenceLapack, EntryPoint = "zheevd_")]
        internal static partial void Zheevd(byte* jobz, byte* uplo, int* n, void* a, int* lda, double* w,
            void* work, int* lwork, double* rwork, int* lrwork, int* iwork, int* liwork, int* info, nuint jobzLen, nuint uploLen);
    }
}
