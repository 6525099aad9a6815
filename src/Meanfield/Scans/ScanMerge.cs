namespace Meanfield.Scans;

/// <summary>
/// Merges the shard files of one scan into a single file, after checking that they come from the same scan and model
/// and that together they hold every grid point exactly once.
/// </summary>
public static class ScanMerge
{
    /// <summary>The shard files of a directory ("*.shard-*-of-*.parquet").</summary>
    public static IReadOnlyList<string> ShardFiles(string directory) =>
        Directory.GetFiles(directory, "*.shard-*-of-*.parquet").Order(StringComparer.Ordinal).ToArray();

    /// <summary>
    /// The shard files named on a command line: a directory stands for its shard files, a file for itself.
    /// </summary>
    /// <exception cref="ScanError">A name is neither a file nor a directory, or no shard file is found.</exception>
    public static IReadOnlyList<string> CollectShardFiles(IReadOnlyList<string> given)
    {
        var files = new List<string>();
        foreach (var g in given)
        {
            if (Directory.Exists(g)) files.AddRange(ShardFiles(g));
            else if (File.Exists(g)) files.Add(g);
            else throw new ScanError($"{g}: no such file or directory");
        }
        if (files.Count == 0) throw new ScanError($"no shard files (*.shard-*-of-*.parquet) in {string.Join(", ", given)}");
        return files;
    }

    public static ScanMergeReport Merge(string directory, string output, bool allowIncomplete = false) =>
        MergeAsync(ShardFiles(directory), output, allowIncomplete).GetAwaiter().GetResult();

    public static ScanMergeReport Merge(IReadOnlyList<string> files, string output, bool allowIncomplete = false) =>
        MergeAsync(files, output, allowIncomplete).GetAwaiter().GetResult();

    /// <summary>
    /// Merges <paramref name="files"/> into <paramref name="output"/> (atomically). Files of different scans are refused
    /// with a <see cref="ScanError"/>. Missing or duplicated points are reported; the file is written only when there are
    /// none, or, with <paramref name="allowIncomplete"/>, when only points are missing.
    /// </summary>
    public static async Task<ScanMergeReport> MergeAsync(IReadOnlyList<string> files, string output,
                                                          bool allowIncomplete = false, CancellationToken ct = default)
    {
        if (files.Count == 0) throw new ScanError("no scan files to merge");
        var tables = new List<ScanTable>();
        foreach (var f in files) tables.Add(await ScanParquet.ReadAsync(f, ct));
        var first = tables[0];
        foreach (var t in tables.Skip(1))
        {
            if (t.ScanSha256 != first.ScanSha256 || t.ModelSha256 != first.ModelSha256)
                throw new ScanError($"{t.Path} comes from a different scan or model than {first.Path} " +
                                    "(scan/model SHA-256 differ): refusing to merge a mix of scans");
            if (!t.Schema.SameLayout(first.Schema))
                throw new ScanError($"{t.Path} has different columns than {first.Path}");
        }

        var grid = first.Grid;
        var holders = new Dictionary<int, List<string>>();
        var rows = new List<ScanRow>();
        foreach (var t in tables)
            foreach (var row in t.Rows)
            {
                if (!holders.TryGetValue(row.PointId, out var list)) holders[row.PointId] = list = [];
                list.Add(t.Path);
                if (list.Count == 1) rows.Add(row);
            }

        PointIssue Issue(int id, IReadOnlyList<string> where)
        {
            var index = grid.IndexOf(id);
            return new PointIssue(id, grid.Axes.Select((a, d) => new KeyValuePair<string, double>(a.Name, a.Values[index[d]])).ToArray(), where);
        }
        var missing = Enumerable.Range(0, grid.Count).Where(id => !holders.ContainsKey(id)).Select(id => Issue(id, [])).ToList();
        var duplicated = holders.Where(kv => kv.Value.Count > 1).OrderBy(kv => kv.Key).Select(kv => Issue(kv.Key, kv.Value)).ToList();
        var outOfGrid = holders.Keys.Where(id => id < 0 || id >= grid.Count).ToList();
        if (outOfGrid.Count > 0) throw new ScanError($"point ids outside the grid: {string.Join(", ", outOfGrid.Take(10))}");

        var missingShards = new List<string>();
        var shardTexts = tables.Select(t => t.Metadata.GetValueOrDefault(ScanMetadata.Shard) ?? "").ToList();
        var declared = shardTexts.Select(s => { try { return (ShardSpec?)ShardSpec.Parse(s); } catch (ScanError) { return null; } })
                                 .OfType<ShardSpec>().ToList();
        if (declared.Count > 0)
        {
            int n = declared[0].Count;
            for (int i = 0; i < n; i++)
                if (!declared.Any(s => s.Index == i && s.Count == n)) missingShards.Add(new ShardSpec(i, n).ToString());
        }

        bool write = duplicated.Count == 0 && (missing.Count == 0 || allowIncomplete);
        if (write)
        {
            var schema = first.Schema.WithSolverState(false).WithErrorColumn();
            var meta = new Dictionary<string, string>(first.Metadata)
            {
                [ScanMetadata.Shard] = ShardSpec.Whole.ToString(),
                [ScanMetadata.Schema] = schema.ToJson(),
                [ScanMetadata.CreatedUtc] = DateTime.UtcNow.ToString("yyyy-MM-ddTHH:mm:ssZ", System.Globalization.CultureInfo.InvariantCulture),
                [ScanMetadata.Merged] = $"merged by `scan merge` from {tables.Count} shard file(s) of {(declared.Count > 0 ? $"a {declared[0].Count}-shard run" : "a sharded run")}"
                                        + $" (shards {string.Join(", ", shardTexts)}){(missing.Count > 0 ? $"; incomplete: {missing.Count} of {grid.Count} points missing" : "")}",
                [ScanMetadata.MergedFiles] = string.Join("\n", tables.Select(t => Path.GetFullPath(t.Path))),
            };
            var sorted = rows.OrderBy(r => r.PointId).Select(r => r with { Result = r.Result with { SolverState = null } }).ToArray();
            await ScanParquet.WriteAsync(Path.GetFullPath(output), schema, sorted, meta, ct);
        }
        return new ScanMergeReport(grid.Count, holders.Values.Sum(l => l.Count), missing, duplicated, missingShards, write);
    }
}
