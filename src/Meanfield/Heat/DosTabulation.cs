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
    /// A coarse DOS over the whole spectrum with a fine one spliced in over the fine grid's range (both from the same
    /// engine, so their integrated DOS agree): the heat sees the structure near the Fermi level at the fine step.
    /// </summary>
    public static TabulatedDos FromDensityOfStates(DensityOfStates coarse, DensityOfStates fine, BoundModel model)
    {
        double lo = fine.Energies[0], hi = fine.Energies[^1];
        var e = new List<double>(); var rho = new List<double>(); var n = new List<double>();
        for (int i = 0; i < coarse.Energies.Length && coarse.Energies[i] < lo; i++)
        { e.Add(coarse.Energies[i]); rho.Add(coarse.Total[i]); n.Add(coarse.Integrated[i]); }
        e.AddRange(fine.Energies); rho.AddRange(fine.Total); n.AddRange(fine.Integrated);
        for (int i = 0; i < coarse.Energies.Length; i++)
            if (coarse.Energies[i] > hi) { e.Add(coarse.Energies[i]); rho.Add(coarse.Total[i]); n.Add(coarse.Integrated[i]); }
        return Build(e, rho, n, model.ElectronsPerCell, model.Unit, model.FormulaUnitsPerCell);
    }

    /// <summary>
    /// The DOS of <paramref name="engine"/> for heat at temperatures up to <paramref name="maxTemperatureK"/>: a coarse
    /// grid of <paramref name="coarsePoints"/> over the spectrum and a fine grid of step at most
    /// <paramref name="fineStepK"/> (K, as energy) over the Fermi window centre +- (60 T_max + margin). The centre is
    /// the energy where the engine's integrated DOS reaches N_e.
    /// </summary>
    public static TabulatedDos ForHeat(TetrahedronDos engine, BoundModel model, double maxTemperatureK, double fineStepK,
                                       int coarsePoints = 2001, int maxFinePoints = 20001)
    {
        var coarse = engine.Compute(new DosOptions { Points = coarsePoints });
        double centre = FermiEnergy(coarse.Energies, coarse.Integrated, model.ElectronsPerCell);
        double k = model.Unit.Kelvins();
        double half = 60 * maxTemperatureK / k + 2 * coarse.Step;
        int points = (int)Math.Clamp(Math.Ceiling(2 * half / (fineStepK / k)) + 1, 101, maxFinePoints);
        var fine = engine.Compute(new DosOptions { Points = points, Minimum = centre - half, Maximum = centre + half });
        return FromDensityOfStates(coarse, fine, model);
    }

    /// <summary>
    /// Energy at which the integrated DOS (ascending, on the same grid) reaches <paramref name="electrons"/>: linear
    /// between grid points; the middle of the plateau when the count is reached inside a gap.
    /// </summary>
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
        throw new ArgumentException($"{electrons} electrons per cell: the DOS holds between {integrated[0]} and {integrated[^1]}");
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
