using Meanfield.Renormalization;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>One temperature of a full mean-field sweep.</summary>
/// <param name="TemperatureK">Temperature (K).</param>
/// <param name="FreeEnergy">Saddle-point free energy F per cell (model energy unit).</param>
/// <param name="Branch">Kondo (r &gt; 0) or decoupled (r = 0).</param>
/// <param name="MinR">Smallest boson amplitude r over the shell groups.</param>
/// <param name="Converged">Whether the saddle point converged.</param>
/// <param name="MolarHeat">C = -T d^2F/dT^2 (J mol^-1 K^-1); NaN at the ends of the grid.</param>
public sealed record MeanFieldHeatPoint(double TemperatureK, double FreeEnergy, SaddlePointBranch Branch, double MinR,
                                        bool Converged, double MolarHeat);

/// <summary>A full mean-field sweep and where, if anywhere, the Kondo branch gives way to the decoupled one.</summary>
/// <param name="Points">Every temperature, ascending.</param>
/// <param name="LastKondoK">Highest temperature (K) still on the Kondo branch below the first decoupled point, or null.</param>
/// <param name="FirstDecoupledK">Lowest decoupled temperature (K) above a Kondo point, or null: T_K^MF lies between.</param>
public sealed record MeanFieldHeatSweep(IReadOnlyList<MeanFieldHeatPoint> Points, double? LastKondoK, double? FirstDecoupledK)
{
    /// <summary>The points with a heat capacity (interior of the grid).</summary>
    public HeatCurve Curve()
    {
        var inner = Points.Where(p => double.IsFinite(p.MolarHeat)).ToList();
        return new HeatCurve(inner.Select(p => p.TemperatureK).ToArray(), inner.Select(p => p.MolarHeat).ToArray());
    }
}

/// <summary>
/// The full mean-field heat capacity C = -T d^2F/dT^2, with the saddle point re-solved at every temperature (each solve
/// warm-started from the previous one), so that the temperature dependence of r and lambda is included. Across
/// T_K^MF the Kondo branch (r &gt; 0) gives way to the decoupled one (r = 0) and C jumps, as at any mean-field
/// second-order transition (Landau &amp; Lifshitz, Statistical Physics Part 1 (1980), sec. 142); in the real system the
/// Kondo scale is a crossover and the jump an artifact of the approximation.
/// </summary>
public static class MeanFieldHeat
{
    /// <summary>r below this fraction of its lowest-temperature value marks a collapsing Kondo branch (decoupled fallback).</summary>
    public const double CollapsingFraction = 0.5;

    /// <param name="solve">Solves the model at a temperature in the model's energy unit, warm-started from the amplitudes given.</param>
    /// <param name="unit">The model's energy unit.</param>
    /// <param name="formulaUnitsPerCell">Formula units per cell, for molar C.</param>
    /// <param name="temperaturesK">Ascending temperatures (K), at least 3; a uniform grid gives second-order differences.</param>
    /// <param name="decoupled">The r = 0 solution at a temperature (energy unit), used when the iteration stalls just above T_K^MF.</param>
    public static MeanFieldHeatSweep Sweep(Func<double, MeanFieldAmplitudes?, SaddlePoint> solve, EnergyUnit unit,
                                           double formulaUnitsPerCell, IReadOnlyList<double> temperaturesK,
                                           Func<double, SaddlePoint?>? decoupled = null,
                                           IProgress<string>? progress = null, CancellationToken cancellation = default)
    {
        if (temperaturesK.Count < 3) throw new ArgumentException("a second derivative needs at least 3 temperatures");
        double kelvins = unit.Kelvins();
        int n = temperaturesK.Count;
        var t = new double[n];
        var f = new double[n];
        var sps = new SaddlePoint[n];
        MeanFieldAmplitudes? guess = null;
        for (int i = 0; i < n; i++)
        {
            cancellation.ThrowIfCancellationRequested();
            if (!(temperaturesK[i] > 0) || (i > 0 && !(temperaturesK[i] > temperaturesK[i - 1])))
                throw new ArgumentException("temperatures must be positive and strictly ascending");
            t[i] = temperaturesK[i] / kelvins;
            // Above T_K^MF the mean-field r stays 0 (Newns & Read, Adv. Phys. 36, 799 (1987)): once decoupled, stay so.
            var sp = decoupled is not null && i > 0 && sps[i - 1].Branch == SaddlePointBranch.Decoupled
                ? decoupled(t[i]) ?? solve(t[i], guess)
                : solve(t[i], guess);
            // Near T_K^MF a warm start from a nearly collapsed r can stall; the solver's own starting points then decide.
            if (!sp.Converged && guess is not null) sp = solve(t[i], null);
            // Just above T_K^MF only r = 0 solves the equations, but the iteration can stall on the way down to it: when
            // r has already fallen below half its value at the lowest temperature (or is gone), take the decoupled solution.
            if (!sp.Converged && decoupled is not null && i > 0
                && sps[i - 1].Groups.Min(g => g.R) < CollapsingFraction * sps[0].Groups.Min(g => g.R))
                sp = decoupled(t[i]) ?? sp;
            if (!sp.Converged)
                throw new InvalidOperationException(
                    $"the saddle point did not converge at T = {temperaturesK[i]:G6} K: {string.Join(" ", sp.Notes)}");
            sps[i] = sp; f[i] = sp.FreeEnergy; guess = sp.Amplitudes;
            progress?.Report($"T = {temperaturesK[i]:G5} K: {(sp.Branch == SaddlePointBranch.Kondo ? $"r = {sp.Groups.Min(g => g.R):G4}" : "decoupled")}");
        }
        var points = new MeanFieldHeatPoint[n];
        double? lastKondo = null, firstDecoupled = null;
        for (int i = 0; i < n; i++)
        {
            double c = double.NaN;
            if (i > 0 && i < n - 1)
            {
                // Three-point second derivative on a possibly uneven grid (common practice; exact for quadratics).
                double h1 = t[i] - t[i - 1], h2 = t[i + 1] - t[i];
                double d2 = 2 * ((f[i + 1] - f[i]) / h2 - (f[i] - f[i - 1]) / h1) / (h1 + h2);
                c = HeatUnits.MolarFromPerCell(-t[i] * d2, formulaUnitsPerCell);
            }
            points[i] = new MeanFieldHeatPoint(temperaturesK[i], f[i], sps[i].Branch,
                                               sps[i].Groups.Count == 0 ? 0 : sps[i].Groups.Min(g => g.R), true, c);
            if (firstDecoupled is null && i > 0 && sps[i].Branch == SaddlePointBranch.Decoupled
                && sps[i - 1].Branch == SaddlePointBranch.Kondo)
            { lastKondo = temperaturesK[i - 1]; firstDecoupled = temperaturesK[i]; }
        }
        return new MeanFieldHeatSweep(points, lastKondo, firstDecoupled);
    }

    /// <summary>A uniform grid of <paramref name="points"/> temperatures over [min, max] (K), one extra step beyond each
    /// end where positive, so that C exists at both ends of the requested range.</summary>
    public static double[] Grid(double minK, double maxK, int points)
    {
        if (!(minK > 0 && maxK > minK) || points < 3) throw new ArgumentException("need 0 < min < max and at least 3 points");
        double h = (maxK - minK) / (points - 1);
        var list = new List<double>();
        if (minK - h > 0) list.Add(minK - h);
        for (int i = 0; i < points; i++) list.Add(minK + i * h);
        list.Add(maxK + h);
        return list.ToArray();
    }
}
