using System.Numerics;
using Meanfield.Numerics;

namespace Meanfield.Tests.Numerics;

/// <summary>Hot k-sum loops must not allocate (project rule): zero bytes over 1000 calls after warm-up.</summary>
public class HouseholderQlAllocationTests
{
    [Theory]
    [InlineData(4, true)]
    [InlineData(8, true)]
    [InlineData(16, false)]
    public void Solve_AllocatesNothingAfterWarmUp(int n, bool withVectors)
    {
        var solver = new HouseholderQlEigensolver(n);
        var source = HermitianTestMatrices.RandomHermitian(n, 3);
        var work = new Complex[n * n];
        var values = new double[n];
        var vectors = withVectors ? new Complex[n * n] : [];
        for (int warm = 0; warm < 10; warm++) { source.CopyTo(work, 0); solver.Solve(work, values, vectors); }

        long before = GC.GetAllocatedBytesForCurrentThread();
        for (int call = 0; call < 1000; call++)
        {
            source.CopyTo(work, 0);
            solver.Solve(work, values, vectors);
        }
        long allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        Assert.Equal(0, allocated);
    }

    [Fact]
    public void LapackSolve_AllocatesNothingAfterWarmUp()
    {
        if (!LapackEigensolver.IsAvailable) return;
        const int n = 8;
        var solver = new LapackEigensolver(n);
        var source = HermitianTestMatrices.RandomHermitian(n, 3);
        var work = new Complex[n * n];
        var values = new double[n];
        var vectors = new Complex[n * n];
        for (int warm = 0; warm < 10; warm++) { source.CopyTo(work, 0); solver.Solve(work, values, vectors); }
        long before = GC.GetAllocatedBytesForCurrentThread();
        for (int call = 0; call < 1000; call++) { source.CopyTo(work, 0); solver.Solve(work, values, vectors); }
        Assert.Equal(0, GC.GetAllocatedBytesForCurrentThread() - before);
    }
}
