using Meanfield.Analysis.Dos;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// Writes a <see cref="DensityOfStates"/> as one row per energy, CSV or Parquet by extension, through
/// <see cref="ColumnTable"/>. Columns (E the model's energy unit): energy_E, energy_minus_mu_E, total_per_E,
/// conduction_per_E, correlated_per_E, site_NAME_per_E (states per cell per energy unit, all flavours), integrated
/// (states per cell below the energy).
/// </summary>
public static class DosTableWriter
{
    /// <summary>The columns of <paramref name="dos"/> in energy unit <paramref name="unit"/>.</summary>
    public static IReadOnlyList<TableColumn> Columns(DensityOfStates dos, EnergyUnit unit)
    {
        string u = unit.Symbol(), d = $"1/{u}";
        return
        [
            new($"energy_{u}", u, "energy"), new($"energy_minus_mu_{u}", u, "energy relative to the chemical potential"),
            new($"total_per_{u}", d, "total DOS, states per cell per energy unit (all flavours)"),
            new($"conduction_per_{u}", d, "DOS projected on the conduction orbitals"),
            new($"correlated_per_{u}", d, "DOS projected on the correlated orbitals"),
            .. dos.SiteNames.Select(s => new TableColumn($"site_{s}_per_{u}", d, $"DOS projected on the orbitals of site {s}")),
            new("integrated", "1", "states per cell below the energy"),
        ];
    }

    /// <summary>Writes the DOS; <paramref name="metadata"/> goes into the header and key-value store.</summary>
    /// <exception cref="ArgumentException">The extension is neither .csv nor .parquet.</exception>
    public static void Write(DensityOfStates dos, double mu, EnergyUnit unit, string path, IEnumerable<KeyValuePair<string, string>>? metadata = null)
    {
        var meta = new List<KeyValuePair<string, string>>
        {
            new("energy_unit", unit.Symbol()),
            new($"chemical_potential_{unit.Symbol()}", mu.ToString("R", System.Globalization.CultureInfo.InvariantCulture)),
            new("method", dos.Method),
        };
        if (metadata is not null) meta.AddRange(metadata);
        var cols = Columns(dos, unit);
        double[][] values = [dos.Energies, [.. dos.Energies.Select(e => e - mu)], dos.Total, dos.Conduction, dos.Correlated, .. dos.BySite, dos.Integrated];
        ColumnTable.Write(path, "density of states", meta, [.. cols.Select((c, i) => new TableData(c, values[i]))]);
    }
}
