using Meanfield.Analysis.Dos;
using Meanfield.Binding;
using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>
/// Turns the DOS engine's <see cref="DensityOfStates"/> (states per cell per energy unit on a uniform grid) into the
/// <see cref="TabulatedDos"/> the heat code integrates, with the model's energy unit and formula units per cell.
/// </summary>
/// <remarks>
/// The engine's integrated DOS is exact for its interpolant, while <see cref="TabulatedDos"/> counts states by the
/// trapezoid rule on the grid; the two differ by the grid's quadrature error. So the electron count handed on is the
/// trapezoid count at the energy where the engine's integrated DOS reaches N_e (the middle of a plateau when N_e is
/// reached inside a gap): the T = 0 Fermi level then sits where the engine puts it, and rho is left unscaled.
/// </remarks>
public static class DosTabulation
{
    /// <summary>One DOS on one grid, for the electron count and units of <paramref name="model"/>.</summary>
    public static TabulatedDos FromDensityOfStates(DensityOfStates dos, BoundModel model) =>
        Build(dos.Energies, dos.Total, dos.Integrated, model.ElectronsPerCell, model.Unit, model.FormulaUnitsPerCell);

    /// <summary>
    /// A coarse DOS over the whole spectrum with finer ones spliced in, each over its own grid's range (all from the same
    /// engine, so their integrated DOS agree). <paramref name="finer"/> runs from the widest to the narrowest grid; each
    /// must lie inside the one before. The heat then sees the structure near the Fermi level at the finest step.
    /// </summary>
    public static TabulatedDos FromDensityOfStates(DensityOfStates coarse, IReadOnlyList<DensityOfStates> finer, BoundModel model)
    {
        var (e, rho, n) = Splice((coarse.Energies, coarse.Total, coarse.Integrated),
                                 finer.Select(f => (f.Energies, f.Total, f.Integrated)).ToList());
        return Build(e, rho, n, model.ElectronsPerCell, model.Unit, model.FormulaUnitsPerCell);
    }

    // Each finer table replaces the coarser points over its own range; all come from one engine, so their counts agree.
    private static (List<double> E, List<double> Rho, List<double> N) Splice(
        (double[] E, double[] Rho, double[] N) coarse, IReadOnlyList<(double[] E, double[] Rho, double[] N)> finer)
    {
        var (e, rho, n) = (coarse.E.ToList(), coarse.Rho.ToList(), coarse.N.ToList());
        foreach (var fine in finer)
        {
            double lo = fine.E[0], hi = fine.E[^1];
            int a = e.FindIndex(x => x >= lo), b = e.FindLastIndex(x => x <= hi);
            if (a < 0 || b < a) throw new ArgumentException("a finer DOS grid must lie inside the grid before it");
            e.RemoveRange(a, b - a + 1); rho.RemoveRange(a, b - a + 1); n.RemoveRange(a, b - a + 1);
            e.InsertRange(a, fine.E); rho.InsertRange(a, fine.Rho); n.InsertRange(a, fine.N);
        }
        return (e, rho, n);
    }

    /// <summary>
    /// The DOS of <paramref name="engine"/> for heat from <paramref name="minTemperatureK"/> to
    /// <paramref name="maxTemperatureK"/>: a coarse grid of <paramref name="coarsePoints"/> over the spectrum and nested
    /// grids around E_F for T_j = T_max, T_max/4, ... down to T_min, each over E_F +- 60 T_j with step T_j/4: every
    /// temperature sees its Fermi window (the kernels fall as e^-|E-mu|/T) resolved on a step below T. E_F is where the
    /// engine's integrated DOS reaches N_e.
    /// </summary>
    public static TabulatedDos ForHeat(TetrahedronDos engine, BoundModel model, double minTemperatureK, double maxTemperatureK,
                                       int coarsePoints = 2001)
    {
        if (!(minTemperatureK > 0 && maxTemperatureK >= minTemperatureK)) throw new ArgumentException("need 0 < T_min <= T_max");
        var coarse = engine.Compute(new DosOptions { Points = coarsePoints });
        double centre = FermiEnergy(coarse.Energies, coarse.Integrated, model.ElectronsPerCell);
        double k = model.Unit.Kelvins();
        var levels = new List<DensityOfStates>();
        double previousHalf = double.PositiveInfinity, previousStep = coarse.Step;
        for (double t = maxTemperatureK; ; t = Math.Max(t / 4, minTemperatureK))
        {
            double step = 0.25 * t / k, half = 60 * t / k;
            if (step < previousStep && half < previousHalf)
            {
                int points = 2 * (int)Math.Ceiling(half / step) + 1;
                levels.Add(engine.Compute(new DosOptions { Points = points, Minimum = centre - half, Maximum = centre + half }));
                previousHalf = half; previousStep = step;
            }
            if (t <= minTemperatureK) break;
        }
        return FromDensityOfStates(coarse, levels, model);
    }

    /// <summary>
    /// The DOS of an <see cref="AdaptiveTetrahedronDos"/> for heat from <paramref name="minTemperatureK"/> to
    /// <paramref name="maxTemperatureK"/>, on one graded grid around the engine's exact T = 0 Fermi level E_F: the step
    /// grows as <see cref="GradedStepFraction"/> x |E - E_F| between k_B T_min/4 and k_B T_max/4 out to
    /// E_F +- 60 k_B T_max, and is the coarse step of <paramref name="coarsePoints"/> over the spectrum beyond. E_F is
    /// itself a grid point, so the tabulated ground state lands on it (on the node of a compensated semimetal).
    /// </summary>
    /// <remarks>
    /// Why graded: near a cone rho ~ E^2 varies on the scale |E - E_F|, and linear interpolation on a step
    /// eta |E| errs by about eta^2/4 of rho there (5e-4 at eta = 0.05), while a uniform step fine enough for T_min
    /// over the window of T_max would need (T_max/T_min) times more energies. One sweep of the tetrahedra computes
    /// the grid; a second, over the few that straddle E_F, fixes E_F.
    /// </remarks>
    public static TabulatedDos ForHeat(AdaptiveTetrahedronDos engine, BoundModel model, double minTemperatureK,
                                       double maxTemperatureK, int coarsePoints = 2001)
    {
        if (!(minTemperatureK > 0 && maxTemperatureK >= minTemperatureK)) throw new ArgumentException("need 0 < T_min <= T_max");
        double k = model.Unit.Kelvins(), ne = model.ElectronsPerCell;
        var (lo, hi) = engine.SpectrumRange();
        double pad = 0.05 * Math.Max(hi - lo, 1e-9);
        double centre = engine.Options.ReferenceEnergy;
        for (int pass = 0; ; pass++)
        {
            var grid = GradedGrid(centre, minTemperatureK / k, maxTemperatureK / k, lo - pad, hi + pad, coarsePoints);
            var dos = engine.Compute(grid);
            int i = 0;
            while (i < grid.Length - 2 && dos.Integrated[i + 1] < ne) i++;
            int j = grid.Length - 1;
            while (j > i + 1 && dos.Integrated[j - 1] > ne) j--;
            // One grid point more on each side: the grid's counts carry rounding, the engine's search does not.
            var (fermi, rhoF) = engine.FermiLevel(ne, (grid[Math.Max(i - 1, 0)], grid[Math.Min(j + 1, grid.Length - 1)]));
            // A Fermi level far from where the grid is finest: tabulate again around it (once).
            if (pass == 0 && Math.Abs(fermi - centre) > minTemperatureK / k) { centre = fermi; continue; }
            var e = dos.Energies.ToList(); var rho = dos.Total.ToList(); var n = dos.Integrated.ToList();
            int at = e.BinarySearch(fermi);
            if (at < 0)
            {
                at = ~at;
                e.Insert(at, fermi); rho.Insert(at, rhoF); n.Insert(at, ne);
            }
            return Build(e, rho, n, ne, model.Unit, model.FormulaUnitsPerCell);
        }
    }

    /// <summary>Growth of the graded grid's step with the distance from E_F (fraction of |E - E_F|).</summary>
    public const double GradedStepFraction = 0.05;

    /// <summary>
    /// Ascending energies: centre, then steps eta |E - centre| clamped to [tMin/4, tMax/4] out to centre +- 60 tMax,
    /// then the uniform coarse step of <paramref name="coarsePoints"/> over [lo, hi] (temperatures as energies).
    /// </summary>
    public static double[] GradedGrid(double centre, double tMin, double tMax, double lo, double hi, int coarsePoints)
    {
        var side = new List<double>();
        double x = 0, reach = FineHalfWidthPerT * tMax;
        while (x < reach)
        {
            x += Math.Clamp(GradedStepFraction * x, FineStepPerT * tMin, FineStepPerT * tMax);
            side.Add(x);
        }
        double coarse = (hi - lo) / (coarsePoints - 1);
        var up = new List<double>(side);
        for (double y = x + coarse; centre + y < hi; y += coarse) up.Add(y);
        var down = new List<double>(side);
        for (double y = x + coarse; centre - y > lo; y += coarse) down.Add(y);
        var grid = new List<double>(up.Count + down.Count + 1);
        for (int i = down.Count - 1; i >= 0; i--) grid.Add(centre - down[i]);
        grid.Add(centre);
        foreach (var y in up) grid.Add(centre + y);
        return grid.ToArray();
    }

    /// <summary>Step of the grid for temperature T, in units of k_B T: the kernels vary on the scale T.</summary>
    public const double FineStepPerT = 0.25;

    /// <summary>Half-width of the grid for temperature T, in units of k_B T: the kernels fall as e^-|E - mu|/T.</summary>
    public const double FineHalfWidthPerT = 60;

    /// <summary>
    /// Energy at which the integrated DOS (ascending, on the same grid) reaches <paramref name="electrons"/>: linear
    /// between grid points; the middle of the plateau when the count is reached inside a gap.
    /// </summary>
    /// <exception cref="RequestError">The count (the model's) lies outside what the DOS holds.</exception>
    public static double FermiEnergy(IReadOnlyList<double> energies, IReadOnlyList<double> integrated, double electrons)
    {
        double tol = 1e-9 * Math.Max(1, electrons);
        int first = -1, last = -1;
        for (int i = 0; i < energies.Count; i++)
            if (Math.Abs(integrated[i] - electrons) <= tol) { if (first < 0) first = i; last = i; }
        if (first >= 0 && last > first) return 0.5 * (energies[first] + energies[last]);
        for (int i = 1; i < energies.Count; i++)
            if (integrated[i] >= electrons && integrated[i - 1] < electrons)
            {
                double s = (electrons - integrated[i - 1]) / (integrated[i] - integrated[i - 1]);
                return energies[i - 1] + s * (energies[i] - energies[i - 1]);
            }
        throw new RequestError($"electrons_per_cell = {electrons:G6}: the DOS holds between {integrated[0]:G6} and {integrated[^1]:G6} states per cell");
    }

    private static TabulatedDos Build(IReadOnlyList<double> energies, IReadOnlyList<double> rho, IReadOnlyList<double> integrated,
                                      double electrons, EnergyUnit unit, double formulaUnits)
    {
        double fermi = FermiEnergy(energies, integrated, electrons);
        var probe = new TabulatedDos(energies, rho, 0.5 * TrapezoidTotal(energies, rho), unit, formulaUnits);
        return new TabulatedDos(energies, rho, probe.StatesBelow(fermi), unit, formulaUnits);
    }

    private static double TrapezoidTotal(IReadOnlyList<double> e, IReadOnlyList<double> rho)
    {
        double s = 0;
        for (int i = 1; i < e.Count; i++) s += 0.5 * (rho[i] + rho[i - 1]) * (e[i] - e[i - 1]);
        return s;
    }
}
