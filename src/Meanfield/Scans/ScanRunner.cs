using System.Diagnostics;

namespace Meanfield.Scans;

/// <summary>
/// Visits the points of a scan shard in snake order, warm-starting each solve from the previously solved neighbour,
/// checkpoints finished rows into chunk files, and writes the final Parquet file. Never touches the console.
/// </summary>
public static class ScanRunner
{
    /// <summary>Runs (or resumes) one shard of a scan into <paramref name="output"/>, holding its lock file meanwhile.</summary>
    /// <exception cref="ScanError">An empty shard, an output locked by another process, leftover chunks without --resume, a mismatched earlier result.</exception>
    public static async Task<ScanSummary> RunAsync(ScanGrid grid, PointSolver solver, ScanOutput output,
                                                   ScanRunOptions options, IProgress<ScanProgress>? progress,
                                                   CancellationToken ct)
    {
        var clock = Stopwatch.StartNew();
        options.Shard.CheckHasPoints(grid.Count);
        // One writer per output: a second process on the same file is refused, naming the holder.
        using var held = OutputLock.Acquire(output.Path, options.Notice);
        var ids = grid.Shard(options.Shard);
        output.RemoveStaleTemporaries();
        if (output.HasChunks && await output.IsFinishedAsync(ids, options.Shard, ct))
        {
            // Stopped between the final rename and the removal of the chunks: the result is complete, the chunks are left over.
            output.RemoveChunks();
            options.Notice?.Invoke($"{output.Path} is complete (an earlier run was stopped while cleaning up); removed its leftover chunks {output.PartsDirectory}");
        }
        if (output.HasChunks && !options.Resume)
            throw new ScanError($"{output.PartsDirectory} holds chunks of an interrupted run: rerun the same command with --resume to continue it, or delete {output.PartsDirectory} to start over");

        if (options.Resume && !output.HasChunks && File.Exists(output.Path))
        {
            var finished = await ScanParquet.ReadAsync(output.Path, ct);
            if (finished.ScanSha256 != output.Provenance.ScanSha256 || finished.ModelSha256 != output.Provenance.ModelSha256)
                throw new ScanError($"{output.Path} exists and belongs to a different scan or model; remove it first");
            return new ScanSummary(output.Path, ids.Count, 0, finished.Rows.Count,
                                   finished.Rows.Count(r => !r.Result.Converged), clock.Elapsed) { Failed = finished.Rows.Count(r => r.Result.Error is not null) };
        }

        var (schema, previous) = await output.LoadChunksAsync(options.Shard, ct, options.Notice);
        var done = new Dictionary<int, ScanRow>();
        var inShard = new HashSet<int>(ids);
        foreach (var row in previous)
            if (inShard.Contains(row.PointId)) done.TryAdd(row.PointId, row);

        var collector = new ChunkCollector(output, grid, options.Shard, options, schema);
        var tracker = new ProgressTracker(ids.Count, done.Count, done.Values.Count(r => !r.Result.Converged), clock, progress);
        int segments = Math.Clamp(options.DegreeOfParallelism, 1, Math.Max(1, ids.Count));
        using var linked = CancellationTokenSource.CreateLinkedTokenSource(ct);
        try
        {
            var tasks = new Task[segments];
            for (int s = 0; s < segments; s++)
            {
                int start = (int)((long)ids.Count * s / segments), end = (int)((long)ids.Count * (s + 1) / segments);
                var segment = ids.Skip(start).Take(end - start).ToArray();
                tasks[s] = Task.Run(() => RunSegmentAsync(grid, segment, done, solver, collector, options, tracker, linked.Token), linked.Token);
            }
            try { await Task.WhenAll(tasks); }
            catch { await linked.CancelAsync(); throw; }
        }
        finally
        {
            await collector.FlushAsync();
        }

        var rows = previous.Where(r => inShard.Contains(r.PointId)).DistinctBy(r => r.PointId).Concat(collector.Written).ToList();
        if (rows.Count != ids.Count) throw new ScanError($"internal: {rows.Count} rows for {ids.Count} points");
        var finalSchema = (collector.Schema ?? new ScanSchema(grid.Axes.Select(a => a.Name).ToList(), [], [])).WithSolverState(false).WithErrorColumn();
        await output.FinalizeAsync(finalSchema, rows, collector.Metadata(finalSchema), CancellationToken.None);
        return new ScanSummary(output.Path, ids.Count, collector.Written.Count, done.Count,
                               rows.Count(r => !r.Result.Converged), clock.Elapsed) { Failed = rows.Count(r => r.Result.Error is not null) };
    }

    /// <summary>
    /// One solve; an exception other than cancellation becomes a failed result carrying its message, so that one bad
    /// point (an extreme value, a tie that divides by zero there) is flagged in its row and the scan goes on.
    /// </summary>
    private static ScanPointResult Attempt(PointSolver solver, ScanPoint point, ScanPointResult? warm, CancellationToken ct)
    {
        try { return solver(point, warm, ct); }
        catch (Exception e) when (!(e is OperationCanceledException && ct.IsCancellationRequested))
        {
            string text = e is InputException or InvalidDataException ? e.Message : $"{e.GetType().Name}: {e.Message}";
            if (!text.Contains(point.Label, StringComparison.Ordinal)) text += $" (at {point.Label})";
            return new ScanPointResult { Converged = false, Error = text };
        }
    }

    private static async Task RunSegmentAsync(ScanGrid grid, int[] segment, IReadOnlyDictionary<int, ScanRow> done,
                                              PointSolver solver, ChunkCollector collector, ScanRunOptions options,
                                              ProgressTracker tracker, CancellationToken ct)
    {
        // The last converged result along this segment's snake: the warm start of the next point.
        ScanPointResult? warm = null;
        foreach (int id in segment)
        {
            if (done.TryGetValue(id, out var old))
            {
                if (old.Result.Converged) warm = old.Result;
                continue;
            }
            ct.ThrowIfCancellationRequested();
            var point = grid.Point(id);
            var watch = Stopwatch.StartNew();
            var result = Attempt(solver, point, warm, ct);
            bool warmStarted = warm is not null;
            if (!result.Converged && warmStarted && options.RetryColdOnFailure)
            {
                var cold = Attempt(solver, point, null, ct);
                if (cold.Converged || (cold.Error is null && (result.Error is not null || !(result.ResidualNorm <= cold.ResidualNorm))))
                { result = cold; warmStarted = false; }
            }
            if (result.Error is not null) options.Notice?.Invoke($"{point.Label} failed and is written with converged = false: {result.Error}");
            var row = new ScanRow(id, options.Shard.Index, point.AxisValues, ScanSchema.ParametersOf(point, result),
                                  point.TemperatureK, result, watch.Elapsed.TotalSeconds, warmStarted);
            await collector.AddAsync(point, row);
            tracker.Finished(id, result.Converged);
            if (result.Converged) warm = result;
        }
    }
}
