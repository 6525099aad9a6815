using Meanfield.Units;

namespace Meanfield.Analysis.Responses;

/// <summary>Unit conversions of the responses (CODATA 2018 exact constants).</summary>
public static class ResponseUnits
{
    /// <summary>e^2 / hbar in siemens (2.434135e-4 S).</summary>
    public const double ConductanceQuantum = PhysicalConstants.ElementaryCharge * PhysicalConstants.ElementaryCharge / PhysicalConstants.HBar;
    /// <summary>e^2 / h in siemens (3.874046e-5 S).</summary>
    public const double ConductanceQuantumH = PhysicalConstants.ElementaryCharge * PhysicalConstants.ElementaryCharge / PhysicalConstants.Planck;
    /// <summary>Centimetres per angstrom (1e-8).</summary>
    public const double CentimetresPerAngstrom = 1e-8;

    /// <summary>Both grids non-empty with finite values; temperatures non-negative (strictly positive when asked).</summary>
    /// <exception cref="ArgumentException">An empty grid.</exception>
    /// <exception cref="RequestError">A chemical potential that is not a finite number (a --window end).</exception>
    /// <exception cref="ArgumentOutOfRangeException">A bad temperature.</exception>
    public static void CheckGrid(IReadOnlyList<double> mu, IReadOnlyList<double> temperatures, bool allowZeroTemperature)
    {
        if (mu.Count == 0) throw new ArgumentException("no chemical potentials given");
        if (temperatures.Count == 0) throw new ArgumentException("no temperatures given");
        if (mu.Any(m => !double.IsFinite(m))) throw new RequestError($"--window: chemical potentials must be finite numbers, found {mu.First(m => !double.IsFinite(m))}");
        foreach (var t in temperatures)
            if (!double.IsFinite(t) || t < 0 || (!allowZeroTemperature && t == 0))
                throw new ArgumentOutOfRangeException(nameof(temperatures),
                    allowZeroTemperature ? $"temperature {t}: must be >= 0" : $"temperature {t}: must be > 0 (the Fermi-surface integral needs k_B T above the mesh's level spacing)");
    }
}
