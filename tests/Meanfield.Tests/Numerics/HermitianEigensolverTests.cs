using System.Numerics;
using Meanfield.Numerics;
using static Meanfield.Tests.Numerics.HermitianTestMatrices;

namespace Meanfield.Tests.Numerics;

/// <summary>
/// The same battery for the managed Householder-QL solver and for LAPACK zheevd. LAPACK cases return early (pass)
/// when no LAPACK library is installed; CI installs Debian's libopenblas0-pthread so they run there.
/// </summary>
public class HermitianEigensolverTests
{
    public static TheoryData<string> Solvers => new() { "householder", "lapack" };

    public static TheoryData<string, int> SolversAndSizes()
    {
        var data = new TheoryData<string, int>();
        foreach (var s in new[] { "householder", "lapack" })
            foreach (var n in new[] { 1, 2, 3, 4, 8, 16, 40, 100 })
                data.Add(s, n);
        return data;
    }

    private static IHermitianEigensolver? Make(string solver, int n) => solver switch
    {
        "householder" => new HouseholderQlEigensolver(n),
        "lapack" => LapackEigensolver.IsAvailable ? new LapackEigensolver(n) : null,
        _ => throw new ArgumentOutOfRangeException(nameof(solver)),
    };

    [Theory]
    [MemberData(nameof(SolversAndSizes))]
    public void RandomHermitian_AgreesWithMathNetAndIsAnEigenDecomposition(string solver, int n)
    {
        if (Make(solver, n) is not { } s) return;
        for (int seed = 1; seed <= 3; seed++)
        {
            var a = RandomHermitian(n, 1000 * n + seed);
            var (values, vectors) = EigenChecks.Solve(s, a);
            var (reference, _) = EigenChecks.Solve(new MathNetEigensolver(n), a);
            EigenChecks.AssertValuesClose(reference, values, FrobeniusNorm(a), $"{solver} vs MathNet, n = {n}");
            EigenChecks.AssertDecomposition(a, n, values, vectors);
            // Values-only path must give the same spectrum.
            EigenChecks.AssertValuesClose(values, EigenChecks.SolveValuesOnly(s, a), FrobeniusNorm(a), "values-only");
        }
    }

    [Theory]
    [MemberData(nameof(SolversAndSizes))]
    public void Householder_AgreesWithLapack(string solver, int n)
    {
        if (solver != "householder" || !LapackEigensolver.IsAvailable) return;
        var a = RandomHermitian(n, 77 + n);
        var (mine, _) = EigenChecks.Solve(new HouseholderQlEigensolver(n), a);
        var (lapack, _) = EigenChecks.Solve(new LapackEigensolver(n), a);
        EigenChecks.AssertValuesClose(lapack, mine, FrobeniusNorm(a), $"Householder vs LAPACK, n = {n}");
    }

    /// <summary>U diag(1,1,2,2,2,3) U^H: the spectrum is known exactly by construction (common practice).</summary>
    [Theory]
    [MemberData(nameof(Solvers))]
    public void DegenerateSpectrum_IsRecoveredWithOrthonormalVectors(string solver)
    {
        double[] spectrum = [1, 1, 2, 2, 2, 3];
        if (Make(solver, spectrum.Length) is not { } s) return;
        var a = WithSpectrum(spectrum, seed: 5);
        var (values, vectors) = EigenChecks.Solve(s, a);
        EigenChecks.AssertValuesClose(spectrum, values, FrobeniusNorm(a), "U diag(1,1,2,2,2,3) U^H");
        EigenChecks.AssertDecomposition(a, spectrum.Length, values, vectors);
    }

    /// <summary>A (x) 1_2 has each eigenvalue of A twice (Kronecker-product spectrum, common practice).</summary>
    [Theory]
    [InlineData("householder", 4)]
    [InlineData("householder", 20)]
    [InlineData("lapack", 4)]
    [InlineData("lapack", 20)]
    public void KroneckerWithIdentity_GivesTwofoldDegenerateSpectrum(string solver, int n)
    {
        if (Make(solver, 2 * n) is not { } s) return;
        var small = RandomHermitian(n, 31 + n);
        var (smallValues, _) = EigenChecks.Solve(new MathNetEigensolver(n), small);
        var a = KroneckerWithIdentity2(small, n);
        var (values, vectors) = EigenChecks.Solve(s, a);
        var doubled = smallValues.SelectMany(v => new[] { v, v }).ToArray();
        EigenChecks.AssertValuesClose(doubled, values, FrobeniusNorm(a), "A (x) 1_2");
        EigenChecks.AssertDecomposition(a, 2 * n, values, vectors);
    }

    /// <summary>A diagonal matrix: eigenvalues are the sorted diagonal, eigenvectors unit vectors up to a phase.</summary>
    [Theory]
    [MemberData(nameof(Solvers))]
    public void DiagonalMatrix_GivesSortedDiagonalExactly(string solver)
    {
        double[] diagonal = [0.5, -2.0, 3.25, 0.5, -7.0, 1.0, 0.0];
        int n = diagonal.Length;
        if (Make(solver, n) is not { } s) return;
        var a = new Complex[n * n];
        for (int i = 0; i < n; i++) a[i * n + i] = diagonal[i];
        var (values, vectors) = EigenChecks.Solve(s, a);
        var sorted = diagonal.Order().ToArray();
        EigenChecks.AssertValuesClose(sorted, values, FrobeniusNorm(a), "diagonal");
        EigenChecks.AssertDecomposition(a, n, values, vectors);
    }

    /// <summary>
    /// Tridiagonal Toeplitz matrix, diagonal a, off-diagonal b e^{i phi_k}: eigenvalues a + 2|b| cos(k pi / (n + 1)),
    /// k = 1..n (the phases are removed by a diagonal unitary). Smith, Numerical Solution of Partial Differential
    /// Equations, 3rd ed. (1985), Sec. 2.11 (from memory); also common practice.
    /// </summary>
    [Theory]
    [InlineData("householder", 2)]
    [InlineData("householder", 9)]
    [InlineData("householder", 50)]
    [InlineData("lapack", 9)]
    [InlineData("lapack", 50)]
    public void TridiagonalToeplitzWithPhases_MatchesCosineFormula(string solver, int n)
    {
        if (Make(solver, n) is not { } s) return;
        const double diag = 0.3, hop = -1.7;
        var a = new Complex[n * n];
        for (int i = 0; i < n; i++)
        {
            a[i * n + i] = diag;
            if (i + 1 < n)
            {
                var t = Complex.FromPolarCoordinates(Math.Abs(hop), 0.37 * i * i + 0.1);
                a[(i + 1) * n + i] = t;
                a[i * n + i + 1] = Complex.Conjugate(t);
            }
        }
        var expected = Enumerable.Range(1, n).Select(k => diag + 2 * Math.Abs(hop) * Math.Cos(k * Math.PI / (n + 1))).Order().ToArray();
        var (values, vectors) = EigenChecks.Solve(s, a);
        EigenChecks.AssertValuesClose(expected, values, FrobeniusNorm(a), "tridiagonal Toeplitz");
        EigenChecks.AssertDecomposition(a, n, values, vectors);
    }

    /// <summary>2x2 [[p, q], [q*, r]]: lambda = (p + r)/2 -+ sqrt(((p - r)/2)^2 + |q|^2) (quadratic formula, common practice).</summary>
    [Theory]
    [MemberData(nameof(Solvers))]
    public void TwoByTwo_MatchesClosedForm(string solver)
    {
        if (Make(solver, 2) is not { } s) return;
        double p = 1.25, r = -0.5;
        var q = new Complex(0.3, -0.8);
        Complex[] a = [p, q, Complex.Conjugate(q), r];
        double root = Math.Sqrt(0.25 * (p - r) * (p - r) + q.Magnitude * q.Magnitude);
        var (values, vectors) = EigenChecks.Solve(s, a);
        EigenChecks.AssertValuesClose([0.5 * (p + r) - root, 0.5 * (p + r) + root], values, FrobeniusNorm(a), "2x2");
        EigenChecks.AssertDecomposition(a, 2, values, vectors);
    }

    [Theory]
    [MemberData(nameof(Solvers))]
    public void ZeroMatrix_GivesZerosAndAnOrthonormalBasis(string solver)
    {
        const int n = 5;
        if (Make(solver, n) is not { } s) return;
        var (values, vectors) = EigenChecks.Solve(s, new Complex[n * n]);
        Assert.All(values, v => Assert.Equal(0.0, v));
        EigenChecks.AssertDecomposition(new Complex[n * n], n, values, vectors);
    }

    /// <summary>One solver instance reused for many matrices: no state may leak between calls.</summary>
    [Theory]
    [MemberData(nameof(Solvers))]
    public void ReusedInstance_GivesSameResultAsFreshOne(string solver)
    {
        const int n = 8;
        if (Make(solver, n) is not { } s) return;
        var a = RandomHermitian(n, 4242);
        var first = EigenChecks.Solve(s, a);
        EigenChecks.Solve(s, RandomHermitian(n, 17));
        EigenChecks.SolveValuesOnly(s, new Complex[n * n]);
        var again = EigenChecks.Solve(s, a);
        Assert.Equal(first.Values, again.Values);
        Assert.Equal(first.Vectors, again.Vectors);
    }

    /// <summary>A NaN entry must end in a clear error, not an endless QL loop or silent garbage.</summary>
    [Fact]
    public void NaNInput_ThrowsInsteadOfLooping()
    {
        var a = RandomHermitian(6, 8);
        a[2 * 6 + 3] = a[3 * 6 + 2] = new Complex(double.NaN, 0);
        Assert.Throws<InvalidOperationException>(() => EigenChecks.Solve(new HouseholderQlEigensolver(6), a));
    }
}
