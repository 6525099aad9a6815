using System.Numerics;
using Meanfield.Numerics;

namespace Meanfield.Tests.Numerics;

/// <summary>k-sums run one solver per thread: concurrent use of separate instances must give the serial results.</summary>
public class ConcurrentSolverTests
{
    [Theory]
    [InlineData("householder", 12)]
    [InlineData("lapack", 60)]
    public void TwoThreads_GiveSameResultsAsOne(string solver, int n)
    {
        if (solver == "lapack" && !LapackEigensolver.IsAvailable) return;
        Func<IHermitianEigensolver> make = solver == "lapack" ? () => new LapackEigensolver(n) : () => new HouseholderQlEigensolver(n);
        const int count = 40;
        var matrices = Enumerable.Range(0, count).Select(i => HermitianTestMatrices.RandomHermitian(n, 900 + i)).ToArray();
        var serialSolver = make();
        var serial = matrices.Select(a => EigenChecks.Solve(serialSolver, a).Values).ToArray();

        var parallel = new double[count][];
        Parallel.For(0, 2, new ParallelOptions { MaxDegreeOfParallelism = 2 }, t =>
        {
            var s = make();
            for (int rep = 0; rep < 3; rep++)
                for (int i = t; i < count; i += 2) parallel[i] = EigenChecks.Solve(s, matrices[i]).Values;
        });
        for (int i = 0; i < count; i++) Assert.Equal(serial[i], parallel[i]);
    }
}
