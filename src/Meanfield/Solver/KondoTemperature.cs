namespace Meanfield.Solver;

/// <summary>
/// The mean-field Kondo temperature T_K^MF: the temperature where r -&gt; 0 (the coherent solution ceases to exist).
/// Found by continuation upward in T from a low temperature, each step warm-started from the last, then bisection
/// between the last temperature with r &gt; 0 and the first without. At mean field the transition is sharp; in the
/// real system it is a crossover, so T_K^MF marks a scale, not a phase transition.
/// </summary>
public static class KondoTemperature
{
    /// <summary>
    /// Narrowest relative bracket a bisection in T is asked for: far above the double-precision spacing (2.2e-16
    /// relative), below which the midpoint equals an end and the bracket stops shrinking (common practice).
    /// </summary>
    public const double MinRelativeTolerance = 1e-12;

    /// <param name="solve">Solves the model at a temperature (energy unit), warm-started from the given amplitudes.</param>
    /// <param name="start">A low starting temperature (energy unit) where the coherent solution exists.</param>
    /// <param name="relativeTolerance">Bisection stops when the bracket is this narrow relative to T.</param>
    public static KondoScaleResult Find(Func<double, Renormalization.MeanFieldAmplitudes?, SaddlePoint> solve, double start,
                                        double relativeTolerance = 1e-3, int maxDoublings = 40, IProgress<string>? progress = null)
    {
        var trail = new List<SaddlePoint>();
        var first = solve(start, null);
        trail.Add(first);
        if (!IsCoherent(first))
            return new KondoScaleResult(null, trail, $"no coherent (r > 0) solution at the starting temperature {start:G4}; start lower");
        double lowT = start, highT = double.NaN;
        var low = first;
        for (int i = 0; i < maxDoublings; i++)
        {
            double t = lowT * 2;
            var sp = solve(t, low.Amplitudes);
            trail.Add(sp);
            progress?.Report($"T = {t:G4}: {(IsCoherent(sp) ? $"r = {sp.Groups.Min(g => g.R):G4}" : "decoupled")}");
            if (IsCoherent(sp)) { lowT = t; low = sp; }
            else { highT = t; break; }
        }
        if (double.IsNaN(highT)) return new KondoScaleResult(null, trail, "r stayed finite up to the largest temperature tried");
        while ((highT - lowT) > relativeTolerance * lowT)
        {
            double t = 0.5 * (lowT + highT);
            var sp = solve(t, low.Amplitudes);
            trail.Add(sp);
            progress?.Report($"T = {t:G6}: {(IsCoherent(sp) ? $"r = {sp.Groups.Min(g => g.R):G4}" : "decoupled")}");
            if (IsCoherent(sp)) { lowT = t; low = sp; } else highT = t;
        }
        return new KondoScaleResult(0.5 * (lowT + highT), trail, null);
    }

    /// <summary>
    /// T_K^MF from the stability of the decoupled solution: <paramref name="curvature"/>(T) is the smallest
    /// dF/d(r^2) at r -&gt; 0 (<see cref="SaddlePointSolver.DecoupledStability"/>), negative below T_K^MF. Doubling from
    /// <paramref name="start"/> brackets the sign change, bisection narrows it. One zone pass per temperature.
    /// </summary>
    /// <exception cref="RequestError"><paramref name="relativeTolerance"/> (the --relative-tolerance option) outside
    /// [<see cref="MinRelativeTolerance"/>, 1): a bisection that could never stop.</exception>
    public static KondoScaleResult FindFromStability(Func<double, double> curvature, double start, double relativeTolerance = 1e-6,
                                                     int maxDoublings = 60, IProgress<string>? progress = null)
    {
        if (!(relativeTolerance >= MinRelativeTolerance && relativeTolerance < 1))
            throw new RequestError(FormattableString.Invariant($"--relative-tolerance {relativeTolerance:G6}: use a number from {MinRelativeTolerance:G3} up to (not including) 1"));
        double lowT = start, c0 = curvature(start);
        if (!(c0 < 0)) return new KondoScaleResult(null, [], $"the decoupled solution is stable already at the starting temperature {start:G4} (dF/dr^2 = {c0:G4}); start lower");
        double highT = double.NaN;
        for (int i = 0; i < maxDoublings; i++)
        {
            double t = lowT * 2, c = curvature(t);
            progress?.Report($"T = {t:G6}: dF/dr^2 = {c:G6}");
            if (c < 0) lowT = t; else { highT = t; break; }
        }
        if (double.IsNaN(highT)) return new KondoScaleResult(null, [], "the decoupled solution stayed unstable up to the largest temperature tried");
        while (highT - lowT > relativeTolerance * lowT)
        {
            double t = 0.5 * (lowT + highT), c = curvature(t);
            if (c < 0) lowT = t; else highT = t;
        }
        return new KondoScaleResult(0.5 * (lowT + highT), [], null);
    }

    /// <summary>A converged solution on the Kondo branch with every r above the collapse threshold.</summary>
    public static bool IsCoherent(SaddlePoint sp) =>
        sp.Converged && sp.Branch == SaddlePointBranch.Kondo && sp.Groups.All(g => g.R > 1e-4);
}

/// <summary>T_K^MF in the energy unit (null when not found, with the reason) and every solution visited.</summary>
public sealed record KondoScaleResult(double? Temperature, IReadOnlyList<SaddlePoint> Trail, string? Problem);
