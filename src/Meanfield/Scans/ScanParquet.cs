using Parquet;

namespace Meanfield.Scans;

/// <summary>
/// Reads and writes scan Parquet files. Writes are atomic (temporary file, then rename) because a truncated Parquet
/// file cannot be read at all.
/// </summary>
public static class ScanParquet
{
    /// <summary>Rows per row group in merged files.</summary>
    public const int RowGroupSize = 100_000;

    public static async Task WriteAsync(string path, ScanSchema schema, IReadOnlyList<ScanRow> rows,
                                        IReadOnlyDictionary<string, string> metadata, CancellationToken ct = default)
    {
        string full = System.IO.Path.GetFullPath(path);
        string tmp = Output.AtomicFile.TemporarySibling(full);
        try
        {
            await using (var stream = new FileStream(tmp, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                await using (var writer = await ParquetWriter.CreateAsync(schema.Parquet, stream, cancellationToken: ct))
                {
                    // Units per column: in the file's metadata (unit.NAME, besides the "units" object) and in each column's own.
                    var energyUnit = metadata.GetValueOrDefault(ScanMetadata.EnergyUnit) ?? "model energy unit";
                    var units = schema.Columns.ToDictionary(c => c.Field.Name, c => c.Unit.Length == 0 ? (c is TextColumn ? "text" : c is SolverStateColumn ? "bytes" : "1") : c.Unit.Replace("{E}", energyUnit, StringComparison.Ordinal));
                    var fileMeta = new Dictionary<string, string>(metadata);
                    foreach (var (name, unit) in units) fileMeta[Output.TableColumn.FileUnitPrefix + name] = unit;
                    writer.CustomMetadata = fileMeta;
                    for (int start = 0; start < rows.Count; start += RowGroupSize)
                    {
                        var slice = rows.Skip(start).Take(RowGroupSize).ToArray();
                        foreach (var r in slice) schema.Check(r);
                        using var group = writer.CreateRowGroup();
                        foreach (var column in schema.Columns)
                            await column.WriteAsync(group, slice, new Dictionary<string, string> { [Output.TableColumn.UnitKey] = units[column.Field.Name] }, ct);
                    }
                }
                stream.Flush(flushToDisk: true);
            }
            File.Move(tmp, full, overwrite: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            TryDelete(tmp);
            throw Output.AtomicFile.CannotWrite(path, System.IO.Path.GetDirectoryName(full) ?? ".", tmp, e);
        }
        catch
        {
            TryDelete(tmp);
            throw;
        }
    }

    /// <summary>Reads a scan table (rows and metadata).</summary>
    /// <exception cref="ScanUnreadableError">The file is not Parquet, is truncated or damaged.</exception>
    /// <exception cref="ScanError">The file is Parquet but not a scan table.</exception>
    public static async Task<ScanTable> ReadAsync(string path, CancellationToken ct = default)
    {
        if (!File.Exists(path)) throw new FileNotFoundException($"{path}: scan table not found", path);
        try { return await ReadCheckedAsync(path, ct); }
        catch (Exception e) when (e is not (ScanError or OperationCanceledException or FileNotFoundException or UnauthorizedAccessException))
        {
            throw new ScanUnreadableError(path, e);
        }
    }

    private static async Task<ScanTable> ReadCheckedAsync(string path, CancellationToken ct)
    {
        await using var stream = File.OpenRead(path);
        await using var reader = await ParquetReader.CreateAsync(stream, cancellationToken: ct);
        var metadata = new Dictionary<string, string>(reader.CustomMetadata ?? new Dictionary<string, string>());
        if (!metadata.TryGetValue(ScanMetadata.Schema, out var schemaJson))
            throw new ScanError($"{path}: not a scan output (no '{ScanMetadata.Schema}' metadata)");
        var schema = ScanSchema.FromJson(schemaJson);
        var rows = new List<ScanRow>();
        for (int g = 0; g < reader.RowGroupCount; g++)
        {
            using var group = reader.OpenRowGroupReader(g);
            var drafts = new RowDraft[group.RowCount];
            for (int i = 0; i < drafts.Length; i++) drafts[i] = new RowDraft(schema);
            foreach (var column in schema.Columns) await column.ReadAsync(group, drafts, ct);
            rows.AddRange(drafts.Select(d => d.Build()));
        }
        return new ScanTable(path, schema, rows, metadata);
    }

    internal static void TryDelete(string path)
    {
        try { if (File.Exists(path)) File.Delete(path); } catch (IOException) { } catch (UnauthorizedAccessException) { }
    }
}
