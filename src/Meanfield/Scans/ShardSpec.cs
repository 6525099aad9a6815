using System.Collections;
using System.Globalization;

namespace Meanfield.Scans;

/// <summary>
/// Which slice of a scan this process computes: shard <see cref="Index"/> (0-based) of <see cref="Count"/>.
/// </summary>
public readonly record struct ShardSpec(int Index, int Count)
{
    public static ShardSpec Whole => new(0, 1);

    public bool IsWhole => Count == 1;

    /// <summary>Parses "I/N" with 0 &lt;= I &lt; N.</summary>
    public static ShardSpec Parse(string text)
    {
        var parts = text.Split('/');
        if (parts.Length != 2
            || !int.TryParse(parts[0].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out int i)
            || !int.TryParse(parts[1].Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out int n))
            throw new ScanError($"shard '{text}' is not of the form I/N (for example 3/8, with 0 <= I < N)");
        if (n < 1 || i >= n) throw new ScanError($"shard '{text}': need N >= 1 and 0 <= I < N");
        return new ShardSpec(i, n);
    }

    /// <summary>
    /// Maps a Slurm job-array task to a shard: index = (id - min) / step, count = (max - min) / step + 1, which must
    /// equal SLURM_ARRAY_TASK_COUNT. Returns null outside a job array. A sparse index list (for example --array=1,2,7)
    /// cannot be mapped and is refused, and so is an array of one task (which shard it is cannot be told).
    /// </summary>
    /// <exception cref="ScanError">A sparse list, a one-task array, or a missing or malformed variable.</exception>
    public static ShardSpec? FromEnvironment(IDictionary env)
    {
        string? Get(string key) => env.Contains(key) ? env[key]?.ToString() : null;
        string? idText = Get("SLURM_ARRAY_TASK_ID");
        if (string.IsNullOrWhiteSpace(idText)) return null;
        int id = Int("SLURM_ARRAY_TASK_ID", idText);
        int min = Int("SLURM_ARRAY_TASK_MIN", Get("SLURM_ARRAY_TASK_MIN"));
        int max = Int("SLURM_ARRAY_TASK_MAX", Get("SLURM_ARRAY_TASK_MAX"));
        int count = Int("SLURM_ARRAY_TASK_COUNT", Get("SLURM_ARRAY_TASK_COUNT"));
        string? stepText = Get("SLURM_ARRAY_TASK_STEP");
        int step = string.IsNullOrWhiteSpace(stepText) ? 1 : Int("SLURM_ARRAY_TASK_STEP", stepText);
        if (step < 1 || max < min || (max - min) % step != 0 || (max - min) / step + 1 != count
            || id < min || id > max || (id - min) % step != 0)
            throw new ScanError(
                $"cannot map Slurm array task {id} to a shard: ids {min}..{max} step {step} do not form a regular range " +
                $"of SLURM_ARRAY_TASK_COUNT={count} tasks (a sparse --array list?). Pass the shard explicitly with " +
                "--shard I/N (0 <= I < N).");
        // One task alone (often a single resubmitted task of a larger array, e.g. --array=7) would run the whole grid
        // into the unsharded file, beside or over the other tasks' shards: ask which shard it is instead.
        if (count == 1)
            throw new ScanError(
                $"inside a Slurm job array of one task (SLURM_ARRAY_TASK_ID={id}, SLURM_ARRAY_TASK_COUNT=1, perhaps one resubmitted task): " +
                "meanfield cannot tell which shard it is. Pass --shard I/N (0 <= I < N, N the size of the original array), " +
                "or --shard 0/1 to compute the whole grid into the unsharded file.");
        return new ShardSpec((id - min) / step, count);

        static int Int(string key, string? text) =>
            int.TryParse(text?.Trim(), NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int v)
                ? v
                : throw new ScanError($"{key}='{text}' is missing or not an integer; pass --shard I/N explicitly");
    }

    /// <summary>
    /// Refuses more shards than grid points: some shards would have no point (with I &gt;= points, shard I is beyond
    /// them), and a job array that large wastes its tasks.
    /// </summary>
    /// <exception cref="ScanError">More shards than points.</exception>
    public void CheckHasPoints(int gridPoints)
    {
        if (Count > 1 && Count > gridPoints)
            throw new ScanError(FormattableString.Invariant(
                $"shard {this}: the grid has {gridPoints} point{(gridPoints == 1 ? "" : "s")}, so {Count} shards leave some without a point{(Index >= gridPoints ? $" (shard {Index} is beyond the points)" : "")}; use at most {gridPoints} shards (nothing written)"));
    }

    /// <summary>File name of this shard's output: "name.shard-003-of-008.parquet" for "name.parquet".</summary>
    public string OutputPath(string basePath)
    {
        if (IsWhole) return basePath;
        string dir = Path.GetDirectoryName(basePath) ?? "";
        string stem = Path.GetFileNameWithoutExtension(basePath);
        return Path.Combine(dir, FormattableString.Invariant($"{stem}.shard-{Index:D3}-of-{Count:D3}.parquet"));
    }

    public override string ToString() => FormattableString.Invariant($"{Index}/{Count}");
}
