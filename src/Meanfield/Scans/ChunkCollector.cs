using System.Diagnostics;

namespace Meanfield.Scans;

/// <summary>
/// Gathers finished rows from the snake segments and writes them as chunk files every few points or seconds. The
/// schema is fixed by the first row (or by chunks of an earlier run).
/// </summary>
internal sealed class ChunkCollector(ScanOutput output, ScanGrid grid, ShardSpec shard, ScanRunOptions options, ScanSchema? schema)
{
    private readonly SemaphoreSlim _gate = new(1, 1);
    private readonly List<ScanRow> _buffer = [];
    private readonly List<ScanRow> _written = [];
    private readonly Stopwatch _sinceFlush = Stopwatch.StartNew();
    private Dictionary<string, string>? _metadata;

    public ScanSchema? Schema { get; private set; } = schema;
    /// <summary>Every row written to a chunk in this run.</summary>
    public IReadOnlyList<ScanRow> Written => _written;

    public async Task AddAsync(ScanPoint point, ScanRow row)
    {
        await _gate.WaitAsync();
        try
        {
            if (Schema is null) Schema = ScanSchema.From(grid, point, row.Result, includeSolverState: true);
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
        try { await FlushLockedAsync(); }
        finally { _gate.Release(); }
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
