using System.Diagnostics;
using System.Numerics;
using Meanfield.Numerics;
using Xunit.Abstractions;

namespace Meanfield.Tests.Numerics;

/// <summary>
/// Prints time per call (best of several short runs) for the solvers; asserts nothing about speed, which depends on
/// the machine's load. Run with --logger "console;verbosity=detailed" to see the table.
/// </summary>
[Collection(nameof(EigensolverTimingReport))]
public class EigensolverTimingReport(ITestOutputHelper output)
{
    [Fact]
    [Trait("Category", "Timing")]
    public void PrintTimePerCall()
    {
        output.WriteLine(LinearAlgebraBackend.Description);
        output.WriteLine("n   Householder-QL  (values only)  MathNet Evd  LAPACK zheevd   [us per call]");
        foreach (int n in new[] { 4, 8, 16 })
        {
            string lapack = LapackEigensolver.IsAvailable ? $"{Time(new LapackEigensolver(n), n, true),8:F2}" : "       -";
            output.WriteLine($"{n,-3} {Time(new HouseholderQlEigensolver(n), n, true),10:F2}  {Time(new HouseholderQlEigensolver(n), n, false),10:F2}  {Time(new MathNetEigensolver(n), n, true),14:F2}  {lapack}");
        }
    }

    private static double Time(IHermitianEigensolver solver, int n, bool withVectors)
    {
        var source = HermitianTestMatrices.RandomHermitian(n, 1);
        var a = new Complex[n * n];
        var values = new double[n];
        var vectors = withVectors ? new Complex[n * n] : [];
        int reps = Math.Max(3, 30_000 / (n * n * n) + 1);
        var warmUp = Stopwatch.StartNew();
        while (warmUp.ElapsedMilliseconds < 300) { source.CopyTo(a, 0); solver.Solve(a, values, vectors); }   // let the JIT reach tier 1
        double best = double.MaxValue;
        for (int trial = 0; trial < 30; trial++)
        {
            var clock = Stopwatch.StartNew();
            for (int r = 0; r < reps; r++) { source.CopyTo(a, 0); solver.Solve(a, values, vectors); }
            best = Math.Min(best, clock.Elapsed.TotalMicroseconds / reps);
        }
        return best;
    }
}

/// <summary>Runs the timing report alone, after the parallel tests, so they do not share the cores with it.</summary>
[CollectionDefinition(nameof(EigensolverTimingReport), DisableParallelization = true)]
public class EigensolverTimingCollection;
