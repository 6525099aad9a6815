using System.Globalization;

namespace Meanfield.Scans;

/// <summary>
/// The output of one scan run: the final Parquet file and, while running, a directory of chunk files
/// ("out.parquet.parts/chunk-00042.parquet"), each a complete Parquet file written atomically. An interrupted run
/// leaves readable chunks and no half-written file; the final file appears only by an atomic rename.
/// </summary>
public sealed class ScanOutput(string path, ScanProvenance provenance)
{
    public string Path { get; } = System.IO.Path.GetFullPath(path);
    public ScanProvenance Provenance { get; } = provenance;
    public string PartsDirectory => Path + ".parts";

    private int _nextChunk;

    public bool HasChunks => Directory.Exists(PartsDirectory) && ChunkFiles().Length > 0;

    public string[] ChunkFiles() => Directory.Exists(PartsDirectory)
        ? Directory.GetFiles(PartsDirectory, "chunk-*.parquet").Order(StringComparer.Ordinal).ToArray()
        : [];

    /// <summary>Where unreadable chunk files are set aside (inside the chunk directory, removed with it at the end).</summary>
    public string QuarantineDirectory => System.IO.Path.Combine(PartsDirectory, "quarantine");

    /// <summary>
    /// Rows of all chunk files, after checking that they belong to this scan and shard. A chunk that cannot be read
    /// (truncated or damaged on disk) is moved to <see cref="QuarantineDirectory"/> and reported to
    /// <paramref name="notice"/>; its points are simply not done and get solved again.
    /// </summary>
    internal async Task<(ScanSchema? Schema, List<ScanRow> Rows)> LoadChunksAsync(ShardSpec shard, CancellationToken ct,
                                                                                  Action<string>? notice = null)
    {
        ScanSchema? schema = null;
        var rows = new List<ScanRow>();
        foreach (var file in ChunkFiles())
        {
            ScanTable table;
            try { table = await ScanParquet.ReadAsync(file, ct); }
            catch (ScanUnreadableError e)
            {
                Directory.CreateDirectory(QuarantineDirectory);
                var aside = System.IO.Path.Combine(QuarantineDirectory, System.IO.Path.GetFileName(file) + FormattableString.Invariant($".{DateTime.UtcNow:yyyyMMddTHHmmssfff}"));
                File.Move(file, aside);
                notice?.Invoke($"{file} is damaged ({e.Reason}); moved it to {aside} and solving its points again");
                continue;
            }
            if (table.ScanSha256 != Provenance.ScanSha256 || table.ModelSha256 != Provenance.ModelSha256)
                throw new ScanError($"{file} belongs to a different scan or model (hash mismatch); delete {PartsDirectory} to start over");
            if (table.Metadata.GetValueOrDefault(ScanMetadata.Shard) != shard.ToString())
                throw new ScanError($"{file} was written for shard {table.Metadata.GetValueOrDefault(ScanMetadata.Shard)}, not {shard}");
            schema ??= table.Schema;
            if (!schema.SameLayout(table.Schema)) throw new ScanError($"{file}: columns differ from the other chunks");
            rows.AddRange(table.Rows);
            int n = int.Parse(System.IO.Path.GetFileNameWithoutExtension(file)["chunk-".Length..], CultureInfo.InvariantCulture);
            _nextChunk = Math.Max(_nextChunk, n + 1);
        }
        return (schema, rows);
    }

    /// <summary>
    /// True when the final file exists, belongs to this scan, model and shard, and holds exactly the points
    /// <paramref name="ids"/>: a run that was stopped after its final rename, before the chunk directory was removed.
    /// </summary>
    internal async Task<bool> IsFinishedAsync(IReadOnlyList<int> ids, ShardSpec shard, CancellationToken ct)
    {
        if (!File.Exists(Path)) return false;
        ScanTable table;
        try { table = await ScanParquet.ReadAsync(Path, ct); }
        catch (ScanError) { return false; }
        if (table.ScanSha256 != Provenance.ScanSha256 || table.ModelSha256 != Provenance.ModelSha256) return false;
        if (table.Metadata.GetValueOrDefault(ScanMetadata.Shard) != shard.ToString()) return false;
        var have = table.Rows.Select(r => r.PointId).ToHashSet();
        return have.Count == table.Rows.Count && have.SetEquals(ids);
    }

    /// <summary>
    /// Deletes temporary siblings (".NAME.*.tmp") that a killed run left beside the final file and the chunks; they are
    /// never renamed into place, so nothing of value is lost.
    /// </summary>
    internal void RemoveStaleTemporaries()
    {
        var dir = System.IO.Path.GetDirectoryName(Path);
        if (dir is not null && Directory.Exists(dir))
            foreach (var f in Directory.GetFiles(dir, $".{System.IO.Path.GetFileName(Path)}.*.tmp")) ScanParquet.TryDelete(f);
        if (Directory.Exists(PartsDirectory))
            foreach (var f in Directory.GetFiles(PartsDirectory, ".chunk-*.tmp")) ScanParquet.TryDelete(f);
    }

    /// <summary>Removes the chunk directory (after a finished run).</summary>
    internal void RemoveChunks()
    {
        if (Directory.Exists(PartsDirectory)) Directory.Delete(PartsDirectory, recursive: true);
    }

    internal async Task WriteChunkAsync(ScanSchema schema, IReadOnlyList<ScanRow> rows,
                                        IReadOnlyDictionary<string, string> metadata, CancellationToken ct)
    {
        Directory.CreateDirectory(PartsDirectory);
        string file = System.IO.Path.Combine(PartsDirectory, FormattableString.Invariant($"chunk-{_nextChunk++:D5}.parquet"));
        await ScanParquet.WriteAsync(file, schema.WithSolverState(true), rows, metadata, ct);
    }

    /// <summary>Writes the final file (rows sorted by point id) atomically and removes the chunk directory.</summary>
    internal async Task FinalizeAsync(ScanSchema schema, IReadOnlyList<ScanRow> rows,
                                      IReadOnlyDictionary<string, string> metadata, CancellationToken ct)
    {
        var dir = System.IO.Path.GetDirectoryName(Path);
        if (!string.IsNullOrEmpty(dir)) Directory.CreateDirectory(dir);
        var sorted = rows.OrderBy(r => r.PointId).Select(r => r with { Result = r.Result with { SolverState = null } }).ToArray();
        await ScanParquet.WriteAsync(Path, schema.WithSolverState(false), sorted, metadata, ct);
        if (Directory.Exists(PartsDirectory)) Directory.Delete(PartsDirectory, recursive: true);
    }
}
