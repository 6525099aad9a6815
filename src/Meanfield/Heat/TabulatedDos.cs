using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>
/// A quasiparticle density of states tabulated on an ascending energy grid, the input of <see cref="QuasiparticleHeat"/>.
/// Between grid points the DOS is linear; outside the grid it is zero. Energies are in <see cref="Unit"/>, the DOS in
/// states per cell per energy unit (all flavours included), so that the integral over the grid counts states per cell.
/// </summary>
public sealed class TabulatedDos
{
    private readonly double[] _energies;
    private readonly double[] _dos;
    private readonly double[] _cumulative; // states per cell below each grid point (exact for the linear interpolant)

    /// <param name="energies">Grid energies, strictly ascending (energy unit).</param>
    /// <param name="statesPerCellPerEnergy">DOS at each grid energy, non-negative (states per cell per energy unit).</param>
    /// <param name="electronsPerCell">Electrons per cell N_e that fill these states; fixes mu(T).</param>
    /// <param name="unit">Energy unit of the grid (temperatures on the API surface are kelvin).</param>
    /// <param name="formulaUnitsPerCell">Formula units per cell, for molar quantities.</param>
    /// <exception cref="ArgumentException">A malformed grid (lengths, fewer than 2 points, not finite, negative, not ascending).</exception>
    /// <exception cref="RequestError">The electron count (the model's) is not strictly between 0 and the states of the DOS.</exception>
    public TabulatedDos(IReadOnlyList<double> energies, IReadOnlyList<double> statesPerCellPerEnergy,
                        double electronsPerCell, EnergyUnit unit = EnergyUnit.MilliElectronVolt,
                        double formulaUnitsPerCell = 1)
    {
        if (energies.Count != statesPerCellPerEnergy.Count)
            throw new ArgumentException($"energies ({energies.Count}) and DOS ({statesPerCellPerEnergy.Count}) differ in length");
        if (energies.Count < 2) throw new ArgumentException("a tabulated DOS needs at least 2 grid points");
        if (!(formulaUnitsPerCell > 0)) throw new ArgumentException("formula units per cell must be positive");
        _energies = energies.ToArray();
        _dos = statesPerCellPerEnergy.ToArray();
        _cumulative = new double[_energies.Length];
        for (int i = 0; i < _energies.Length; i++)
        {
            if (!double.IsFinite(_energies[i]) || !double.IsFinite(_dos[i]))
                throw new ArgumentException($"grid point {i}: energy and DOS must be finite");
            if (_dos[i] < 0) throw new ArgumentException($"grid point {i}: DOS {_dos[i]} is negative");
            if (i > 0)
            {
                if (!(_energies[i] > _energies[i - 1]))
                    throw new ArgumentException($"grid point {i}: energies must be strictly ascending");
                _cumulative[i] = _cumulative[i - 1] + 0.5 * (_dos[i] + _dos[i - 1]) * (_energies[i] - _energies[i - 1]);
            }
        }
        if (!(electronsPerCell > 0 && electronsPerCell < TotalStates))
            throw new RequestError(
                $"electrons_per_cell = {electronsPerCell:G6}: must lie strictly between 0 and the {TotalStates:G6} states of the DOS");
        ElectronsPerCell = electronsPerCell;
        Unit = unit;
        FormulaUnitsPerCell = formulaUnitsPerCell;
    }

    public ReadOnlySpan<double> Energies => _energies;
    /// <summary>DOS at the grid energies (states per cell per energy unit).</summary>
    public ReadOnlySpan<double> Dos => _dos;
    public double ElectronsPerCell { get; }
    public EnergyUnit Unit { get; }
    public double FormulaUnitsPerCell { get; }
    public double MinEnergy => _energies[0];
    public double MaxEnergy => _energies[^1];
    /// <summary>Integral of the DOS over the grid (states per cell).</summary>
    public double TotalStates => _cumulative[^1];

    /// <summary>Index i of the segment [E_i, E_{i+1}] holding <paramref name="energy"/>, clamped to the grid.</summary>
    public int Segment(double energy)
    {
        int i = Array.BinarySearch(_energies, energy);
        if (i < 0) i = ~i - 1;
        return Math.Clamp(i, 0, _energies.Length - 2);
    }

    /// <summary>Linearly interpolated DOS (zero outside the grid).</summary>
    public double At(double energy)
    {
        if (energy < MinEnergy || energy > MaxEnergy) return 0;
        int i = Segment(energy);
        double t = (energy - _energies[i]) / (_energies[i + 1] - _energies[i]);
        return _dos[i] + t * (_dos[i + 1] - _dos[i]);
    }

    /// <summary>States per cell below <paramref name="energy"/>: the T = 0 occupation, exact for the linear interpolant.</summary>
    public double StatesBelow(double energy)
    {
        if (energy <= MinEnergy) return 0;
        if (energy >= MaxEnergy) return TotalStates;
        int i = Segment(energy);
        double h = energy - _energies[i];
        return _cumulative[i] + h * (_dos[i] + 0.5 * h * (_dos[i + 1] - _dos[i]) / (_energies[i + 1] - _energies[i]));
    }

    /// <summary>
    /// The T = 0 Fermi level: the energy below which N_e states lie; if that count is reached across a zero-DOS gap,
    /// the middle of the gap (the lowest energy holding N_e states and the highest holding no more, averaged).
    /// </summary>
    public double GroundStateFermiLevel() => 0.5 * (Bisect(strict: false) + Bisect(strict: true));

    private double Bisect(bool strict)
    {
        double lo = MinEnergy, hi = MaxEnergy;
        for (int it = 0; it < 200 && hi - lo > 1e-15 * Math.Max(1, Math.Abs(hi)); it++)
        {
            double mid = 0.5 * (lo + hi);
            double n = StatesBelow(mid);
            if (strict ? n <= ElectronsPerCell : n < ElectronsPerCell) lo = mid; else hi = mid;
        }
        return 0.5 * (lo + hi);
    }
}
