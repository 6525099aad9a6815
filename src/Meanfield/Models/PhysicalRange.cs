using Meanfield.Units;

namespace Meanfield.Models;

/// <summary>
/// The range of numbers a model file may hold, documented in models/README.md ("Ranges"). Values outside it are typos
/// or unit slips, and the eigensolvers would overflow on them (squares of 1e200 are infinite), so loading refuses them
/// with file:line:column and the field; `check` and `solve` therefore accept the same models.
/// </summary>
public static class PhysicalRange
{
    /// <summary>
    /// Largest magnitude of any energy (hopping, hybridization, level, on-site, field, spin-orbit, half-width,
    /// temperature): 1 keV. Electronic energy scales of solids lie below about 100 eV (common practice); 1 keV leaves a
    /// factor of ten and keeps every product the solver forms far below overflow.
    /// </summary>
    public const double MaxEnergyElectronVolts = 1e3;

    /// <summary>Smallest lattice constant, angstrom: a tenth of the shortest bond in solids (common practice).</summary>
    public const double MinLatticeConstant = 0.1;

    /// <summary>Largest lattice constant, angstrom: several times the cells of moire superlattices, about 100 angstrom (common practice).</summary>
    public const double MaxLatticeConstant = 1e3;

    /// <summary>Largest magnitude of a site-position or explicit-vector component, in units of the lattice constant.</summary>
    public const double MaxReducedCoordinate = 100;

    /// <summary>Smallest length of an explicit Bravais vector, in units of the lattice constant.</summary>
    public const double MinReducedVectorLength = 1e-3;

    /// <summary>Largest |n_i| of a bond's lattice-vector coordinates (cells): longer bonds have no physical meaning.</summary>
    public const int MaxBondCells = 100;

    /// <summary>Largest number of formula units per cell.</summary>
    public const double MaxFormulaUnitsPerCell = 1e4;

    /// <summary>Fewest k-mesh divisions per axis: the solver needs two (one point cannot sample a band).</summary>
    public const int MinMesh = 2;

    /// <summary>Most k-mesh divisions per axis.</summary>
    public const int MaxMesh = 4096;

    /// <summary>Largest iteration cap of the [solver] table.</summary>
    public const int MaxIterations = 1_000_000;

    /// <summary>The energy bound in the model's unit.</summary>
    public static double MaxEnergy(EnergyUnit unit) => MaxEnergyElectronVolts * EnergyUnit.ElectronVolt.Joules() / unit.Joules();

    /// <summary>"1e+06 meV (1 keV)": the bound as written in messages.</summary>
    public static string MaxEnergyText(EnergyUnit unit) =>
        string.Create(System.Globalization.CultureInfo.InvariantCulture, $"{MaxEnergy(unit):G3} {unit.Symbol()} (1 keV)");

    /// <summary>Throws when |<paramref name="value"/>| exceeds the energy bound.</summary>
    /// <exception cref="ModelError">The value is not finite or beyond <see cref="MaxEnergyElectronVolts"/>.</exception>
    public static double CheckEnergy(double value, EnergyUnit unit, SourceLocation where, string field, string what = "energy")
    {
        if (!double.IsFinite(value) || Math.Abs(value) > MaxEnergy(unit))
            throw new ModelError(where, field, string.Create(System.Globalization.CultureInfo.InvariantCulture,
                $"{what} {value:G6} {unit.Symbol()} is outside the physical range: its magnitude must be at most {MaxEnergyText(unit)}; see \"Ranges\" in models/README.md"));
        return value;
    }
}
