namespace Meanfield.Output;

/// <summary>
/// One column of a written table: its name (energies and other quantities end in their unit, as in `energy_meV`,
/// `k_x_per_angstrom`), its unit ("1" for pure numbers and counts, "text" for names) and its meaning. Parquet writers
/// put unit and meaning into the column's own key-value metadata (numeric columns: Parquet.Net 6 writes column
/// metadata for value types only) and, as `unit.NAME` and `description.NAME`, into the file's.
/// </summary>
public sealed record TableColumn(string Name, string Unit, string Description)
{
    /// <summary>Key of a column's unit in a column's own Parquet metadata.</summary>
    public const string UnitKey = "unit";
    /// <summary>Key of a column's meaning in a column's own Parquet metadata.</summary>
    public const string DescriptionKey = "description";
    /// <summary>Prefix of the file-level key naming a column's unit: `unit.energy_meV = meV`.</summary>
    public const string FileUnitPrefix = "unit.";
    /// <summary>Prefix of the file-level key giving a column's meaning.</summary>
    public const string FileDescriptionPrefix = "description.";

    /// <summary>The column's own Parquet key-value metadata.</summary>
    public Dictionary<string, string> Metadata() => new() { [UnitKey] = Unit, [DescriptionKey] = Description };

    /// <summary>Adds `unit.NAME = UNIT` and `description.NAME = MEANING` for every column to a file's key-value metadata.</summary>
    public static void AddUnits(IDictionary<string, string> fileMetadata, IEnumerable<TableColumn> columns)
    {
        foreach (var c in columns)
        {
            fileMetadata[FileUnitPrefix + c.Name] = c.Unit;
            fileMetadata[FileDescriptionPrefix + c.Name] = c.Description;
        }
    }
}
