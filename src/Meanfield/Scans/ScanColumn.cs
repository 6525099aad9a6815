using Parquet;
using Parquet.Schema;

namespace Meanfield.Scans;

/// <summary>One Parquet column of a scan: its field, its unit ("{E}" stands for the model energy unit), and how it is
/// taken from a row and put back into one.</summary>
public abstract class ScanColumn(DataField field, string unit)
{
    public DataField Field { get; } = field;
    public string Unit { get; } = unit;
    /// <summary>Writes the column of <paramref name="rows"/>; <paramref name="own"/> is its own metadata (unit), kept by numeric columns.</summary>
    internal abstract Task WriteAsync(ParquetRowGroupWriter writer, IReadOnlyList<ScanRow> rows, Dictionary<string, string>? own, CancellationToken ct);
    internal abstract Task ReadAsync(ParquetRowGroupReader reader, RowDraft[] rows, CancellationToken ct);
    /// <summary>The column's value in a row (boxed; null where not computed).</summary>
    public abstract object? Value(ScanRow row);
}

internal sealed class ValueColumn<T>(string name, string unit, Func<ScanRow, T> get, Action<RowDraft, T> set)
    : ScanColumn(new DataField<T>(name, false), unit) where T : struct
{
    public override object? Value(ScanRow row) => get(row);

    internal override Task WriteAsync(ParquetRowGroupWriter writer, IReadOnlyList<ScanRow> rows, Dictionary<string, string>? own, CancellationToken ct) =>
        writer.WriteAsync<T>(Field, rows.Select(get).ToArray(), null, own, ct);

    internal override async Task ReadAsync(ParquetRowGroupReader reader, RowDraft[] rows, CancellationToken ct)
    {
        var buffer = new T[rows.Length];
        await reader.ReadAsync<T>(Field, buffer, null, ct);
        for (int i = 0; i < rows.Length; i++) set(rows[i], buffer[i]);
    }
}

internal sealed class NullableColumn<T>(string name, string unit, Func<ScanRow, T?> get, Action<RowDraft, T?> set)
    : ScanColumn(new DataField<T?>(name), unit) where T : struct
{
    public override object? Value(ScanRow row) => get(row);

    internal override Task WriteAsync(ParquetRowGroupWriter writer, IReadOnlyList<ScanRow> rows, Dictionary<string, string>? own, CancellationToken ct) =>
        writer.WriteAsync<T>(Field, rows.Select(get).ToArray(), null, own, ct);

    internal override async Task ReadAsync(ParquetRowGroupReader reader, RowDraft[] rows, CancellationToken ct)
    {
        var buffer = new T?[rows.Length];
        await reader.ReadAsync<T>(Field, buffer, null, ct);
        for (int i = 0; i < rows.Length; i++) set(rows[i], buffer[i]);
    }
}

internal sealed class TextColumn(string name, string unit, Func<ScanRow, string?> get, Action<RowDraft, string?> set)
    : ScanColumn(new DataField<string>(name, true), unit)
{
    public override object? Value(ScanRow row) => get(row);

    internal override Task WriteAsync(ParquetRowGroupWriter writer, IReadOnlyList<ScanRow> rows, Dictionary<string, string>? own, CancellationToken ct) =>
        writer.WriteAsync(Field, rows.Select(get).ToArray()!, null); // Parquet.Net 6: column metadata for value types only

    internal override async Task ReadAsync(ParquetRowGroupReader reader, RowDraft[] rows, CancellationToken ct)
    {
        var buffer = new string[rows.Length];
        await reader.ReadAsync(Field, buffer, null, ct);
        for (int i = 0; i < rows.Length; i++) set(rows[i], buffer[i]);
    }
}

/// <summary>The solver's warm-start payload as little-endian doubles.</summary>
internal sealed class SolverStateColumn() : ScanColumn(new DataField<byte[]>("solver_state", true), "")
{
    public override object? Value(ScanRow row) => row.Result.SolverState;

    internal override Task WriteAsync(ParquetRowGroupWriter writer, IReadOnlyList<ScanRow> rows, Dictionary<string, string>? own, CancellationToken ct) =>
        writer.WriteAsync(Field, rows.Select(r => r.Result.SolverState is { } s
            ? System.Runtime.InteropServices.MemoryMarshal.AsBytes(s.AsSpan()).ToArray() : null).ToArray()!, null);

    internal override async Task ReadAsync(ParquetRowGroupReader reader, RowDraft[] rows, CancellationToken ct)
    {
        var buffer = new byte[rows.Length][];
        await reader.ReadAsync(Field, buffer, null, ct);
        for (int i = 0; i < rows.Length; i++)
            rows[i].SolverState = buffer[i] is { } b
                ? System.Runtime.InteropServices.MemoryMarshal.Cast<byte, double>(b).ToArray() : null;
    }
}
