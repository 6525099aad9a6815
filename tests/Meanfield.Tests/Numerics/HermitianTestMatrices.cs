using System.Numerics;

namespace Meanfield.Tests.Numerics;

/// <summary>Seeded test matrices (row-major n x n) and the norms the acceptance criteria are measured in.</summary>
internal static class HermitianTestMatrices
{
    public static Complex[] RandomHermitian(int n, int seed)
    {
        var rng = new Random(seed);
        var a = new Complex[n * n];
        for (int i = 0; i < n; i++)
        {
            a[i * n + i] = 2 * rng.NextDouble() - 1;
            for (int j = 0; j < i; j++)
            {
                var z = new Complex(2 * rng.NextDouble() - 1, 2 * rng.NextDouble() - 1);
                a[i * n + j] = z;
                a[j * n + i] = Complex.Conjugate(z);
            }
        }
        return a;
    }

    /// <summary>Random unitary by Gram-Schmidt on random complex columns.</summary>
    public static Complex[] RandomUnitary(int n, int seed)
    {
        var rng = new Random(seed);
        var u = new Complex[n * n];
        for (int i = 0; i < n * n; i++) u[i] = new Complex(2 * rng.NextDouble() - 1, 2 * rng.NextDouble() - 1);
        for (int c = 0; c < n; c++)
        {
            for (int pass = 0; pass < 2; pass++)   // twice is enough for working-precision orthogonality
                for (int b = 0; b < c; b++)
                {
                    Complex dot = 0;
                    for (int i = 0; i < n; i++) dot += Complex.Conjugate(u[i * n + b]) * u[i * n + c];
                    for (int i = 0; i < n; i++) u[i * n + c] -= dot * u[i * n + b];
                }
            double norm = 0;
            for (int i = 0; i < n; i++) norm += u[i * n + c].Magnitude * u[i * n + c].Magnitude;
            norm = Math.Sqrt(norm);
            for (int i = 0; i < n; i++) u[i * n + c] /= norm;
        }
        return u;
    }

    /// <summary>U diag(spectrum) U^H: a Hermitian matrix with exactly known (possibly repeated) eigenvalues.</summary>
    public static Complex[] WithSpectrum(double[] spectrum, int seed)
    {
        int n = spectrum.Length;
        var u = RandomUnitary(n, seed);
        var a = new Complex[n * n];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
            {
                Complex s = 0;
                for (int k = 0; k < n; k++) s += u[i * n + k] * spectrum[k] * Complex.Conjugate(u[j * n + k]);
                a[i * n + j] = s;
            }
        for (int i = 0; i < n; i++) a[i * n + i] = a[i * n + i].Real;
        return a;
    }

    /// <summary>A (x) 1_2: every eigenvalue of A twice, like Kramers-degenerate bands with time reversal and inversion.</summary>
    public static Complex[] KroneckerWithIdentity2(Complex[] a, int n)
    {
        int m = 2 * n;
        var k = new Complex[m * m];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
                for (int s = 0; s < 2; s++)
                    k[(2 * i + s) * m + 2 * j + s] = a[i * n + j];
        return k;
    }

    public static double FrobeniusNorm(ReadOnlySpan<Complex> a)
    {
        double s = 0;
        foreach (var z in a) s += z.Real * z.Real + z.Imaginary * z.Imaginary;
        return Math.Sqrt(s);
    }
}
