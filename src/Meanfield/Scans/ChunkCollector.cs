using System.Diagnostics;

namespace Meanfield.Scans;

/// <summary>
/// Gathers finished rows from the snake segments and writes them as chunk files every few points or seconds. The
/// schema is fixed by the first solved row (or by chunks of an earlier run); rows of points whose solve threw wait
/// for it, since they carry no correlated groups of their own.
/// </summary>
internal sealed class ChunkCollector(ScanOutput output, ScanGrid grid, ShardSpec shard, ScanRunOptions options, ScanSchema? schema)
{
    private readonly SemaphoreSlim _gate = new(1, 1);
    private readonly List<ScanRow> _buffer = [];
    private readonly List<ScanRow> _written = [];
    private readonly List<ScanRow> _pending = [];
    private readonly Stopwatch _sinceFlush = Stopwatch.StartNew();
    private Dictionary<string, string>? _metadata;

    public ScanSchema? Schema { get; private set; } = schema?.WithErrorColumn();
    /// <summary>Every row written to a chunk in this run.</summary>
    public IReadOnlyList<ScanRow> Written => _written;

    public async Task AddAsync(ScanPoint point, ScanRow row)
    {
        await _gate.WaitAsync();
        try
        {
            if (Schema is null)
            {
                if (row.Result.Error is not null) { _pending.Add(row); return; }
                Schema = ScanSchema.From(grid, point, row.Result, includeSolverState: true);
                foreach (var p in _pending) _buffer.Add(Fit(p));
                _pending.Clear();
            }
            row = Fit(row);
            Schema.Check(row);
            _buffer.Add(row);
            if (_buffer.Count >= options.FlushEveryPoints || _sinceFlush.Elapsed >= options.FlushInterval)
                await FlushLockedAsync();
        }
        finally { _gate.Release(); }
    }

    /// <summary>Writes what is buffered. Runs without a cancellation token: finished points must reach disk.</summary>
    public async Task FlushAsync()
    {
        await _gate.WaitAsync();
        try
        {
            if (Schema is null && _pending.Count > 0)
            {
                // Every point failed: the columns come from the grid and the numeric overrides alone.
                var first = _pending[0];
                Schema = new ScanSchema(grid.Axes.Select(a => a.Name).ToList(), first.Parameters.Select(p => p.Key).ToList(), [], includeSolverState: true);
                _buffer.AddRange(_pending);
                _pending.Clear();
            }
            await FlushLockedAsync();
        }
        finally { _gate.Release(); }
    }

    // A failed point's row gets the schema's groups with unknown values (NaN here, null in the file).
    private ScanRow Fit(ScanRow row)
    {
        if (row.Result.Error is null || Schema is null || row.Result.Groups.Count == Schema.GroupNames.Count) return row;
        var groups = Schema.GroupNames.Select(g => new GroupSolution(g, double.NaN, double.NaN, double.NaN)).ToArray();
        return row with { Result = row.Result with { Groups = groups } };
    }

    public Dictionary<string, string> Metadata(ScanSchema s) =>
        ScanMetadata.Build(output.Provenance, grid, s, shard);

    private async Task FlushLockedAsync()
    {
        if (_buffer.Count == 0 || Schema is null) return;
        _metadata ??= Metadata(Schema.WithSolverState(true));
        await output.WriteChunkAsync(Schema, _buffer, _metadata, CancellationToken.None);
        _written.AddRange(_buffer);
        _buffer.Clear();
        _sinceFlush.Restart();
    }
}
