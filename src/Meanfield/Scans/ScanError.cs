namespace Meanfield.Scans;

/// <summary>A scan cannot run or be merged because of its input (bad shard, mixed scans, existing partial output).</summary>
public class ScanError(string message) : InputException(message);

/// <summary>A file that should be a scan table cannot be read: not Parquet, truncated or damaged.</summary>
public sealed class ScanUnreadableError(string path, Exception inner)
    : ScanError($"{path}: not a readable scan table (not Parquet, truncated or damaged: {inner.Message})")
{
    /// <summary>The unreadable file.</summary>
    public string Path { get; } = path;
    /// <summary>What the Parquet reader said.</summary>
    public string Reason { get; } = inner.Message;
}
