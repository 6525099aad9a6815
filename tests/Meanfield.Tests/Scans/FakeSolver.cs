using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

/// <summary>
/// A stand-in for the saddle-point solver: closed-form functions of the axis values, with points where
/// (i + j) % 5 == 0 reported as not converged. Records every call.
/// </summary>
internal sealed class FakeSolver
{
    public readonly List<(int Id, ScanPointResult? Warm)> Calls = [];
    public Action<int>? OnCall;

    public static double Mu(double v, double ratio) => 0.01 * v - ratio;
    public static double R(double v, double ratio) => Math.Exp(-100.0 / v) * (1 - ratio);
    public static bool Converges(ScanPoint p) => (p.Index[0] + p.Index[1]) % 5 != 0;

    public ScanPointResult Solve(ScanPoint p, ScanPointResult? warm, CancellationToken ct)
    {
        lock (Calls) Calls.Add((p.Id, warm));
        OnCall?.Invoke(Calls.Count);
        ct.ThrowIfCancellationRequested();
        double v = p.Axis("V"), ratio = p.Axis("ratio");
        bool ok = Converges(p);
        return new ScanPointResult
        {
            Converged = ok,
            Iterations = ok ? 7 : 200,
            ResidualNorm = ok ? 1e-11 : 0.3,
            Mu = Mu(v, ratio),
            FreeEnergy = -v * ratio,
            Groups = [new GroupSolution("f", R(v, ratio), 0.5 * v, 1 - R(v, ratio) * R(v, ratio))],
            Parameters = [new("V", v), new("lso", 20), new("m", ratio * 20)],
            Spectrum = new()
            {
                DirectGap = ratio > 0.3 ? null : 2 * R(v, ratio),
                NodeCount = ratio > 0.3 ? 4 : 0,
                Phase = ratio > 0.3 ? "weyl-semimetal" : "kondo-insulator",
            },
            SolverState = [R(v, ratio), 0.5 * v, Mu(v, ratio)],
        };
    }
}
