using System.Numerics;
using Meanfield.Numerics;

namespace Meanfield.Tests.Numerics;

/// <summary>
/// Definitional properties of a Hermitian eigen-decomposition A V = V diag(lambda), V^H V = 1 (common practice), with
/// tolerances of a backward-stable solver: the computed pairs are exact for A + E with ||E|| ~ eps ||A|| and the
/// computed V is unitary to ~eps (Golub &amp; Van Loan, Matrix Computations, 4th ed. 2013, Sec. 8.3, rounding-error
/// analysis of the symmetric QR algorithm; section number from memory). The limits leave a factor ~100 of headroom.
/// </summary>
internal static class EigenChecks
{
    public const double ValueTolerance = 1e-12;        // relative to ||A||_F
    public const double ResidualTolerance = 1e-11;     // relative to ||A||_F
    public const double OrthonormalityTolerance = 1e-12;

    public static (double[] Values, Complex[] Vectors) Solve(IHermitianEigensolver solver, Complex[] a)
    {
        int n = solver.Size;
        var work = (Complex[])a.Clone();
        var values = new double[n];
        var vectors = new Complex[n * n];
        solver.Solve(work, values, vectors);
        return (values, vectors);
    }

    public static double[] SolveValuesOnly(IHermitianEigensolver solver, Complex[] a)
    {
        var values = new double[solver.Size];
        solver.Solve((Complex[])a.Clone(), values, Span<Complex>.Empty);
        return values;
    }

    /// <summary>Ascending order, ||A v_m - lambda_m v_m|| and ||V^H V - 1||_max.</summary>
    public static void AssertDecomposition(Complex[] a, int n, double[] values, Complex[] vectors)
    {
        double norm = HermitianTestMatrices.FrobeniusNorm(a);
        for (int m = 1; m < n; m++) Assert.True(values[m] >= values[m - 1], $"eigenvalues not ascending at {m}");
        double worstResidual = 0;
        for (int m = 0; m < n; m++)
        {
            double r2 = 0;
            for (int i = 0; i < n; i++)
            {
                Complex s = -values[m] * vectors[i * n + m];
                for (int j = 0; j < n; j++) s += a[i * n + j] * vectors[j * n + m];
                r2 += s.Real * s.Real + s.Imaginary * s.Imaginary;
            }
            worstResidual = Math.Max(worstResidual, Math.Sqrt(r2));
        }
        Assert.True(worstResidual <= ResidualTolerance * norm, $"residual {worstResidual:E3} > {ResidualTolerance} * ||A|| = {ResidualTolerance * norm:E3}");

        double worstOrtho = 0;
        for (int p = 0; p < n; p++)
            for (int q = 0; q < n; q++)
            {
                Complex s = 0;
                for (int i = 0; i < n; i++) s += Complex.Conjugate(vectors[i * n + p]) * vectors[i * n + q];
                worstOrtho = Math.Max(worstOrtho, (s - (p == q ? 1 : 0)).Magnitude);
            }
        Assert.True(worstOrtho <= OrthonormalityTolerance, $"|V^H V - 1|_max = {worstOrtho:E3}");
    }

    public static void AssertValuesClose(double[] expected, double[] actual, double norm, string what)
    {
        Assert.Equal(expected.Length, actual.Length);
        double tol = ValueTolerance * Math.Max(norm, 1e-300);
        for (int m = 0; m < expected.Length; m++)
            Assert.True(Math.Abs(expected[m] - actual[m]) <= tol,
                $"{what}: eigenvalue {m}: expected {expected[m]:R}, got {actual[m]:R} (tolerance {tol:E2})");
    }
}
