namespace Meanfield.Scans;

/// <summary>A scan cannot run or be merged because of its input (bad shard, mixed scans, existing partial output).</summary>
public class ScanError(string message) : Exception(message);
