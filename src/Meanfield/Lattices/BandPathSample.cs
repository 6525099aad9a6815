namespace Meanfield.Lattices;

/// <summary>
/// k-points sampled along a <see cref="BandPath"/>: Cartesian k (inverse angstrom), the cumulative path length along
/// the path (inverse angstrom; it does not advance across a '|' break), the label of each k-point that is a path vertex
/// (empty elsewhere), the tick marks for plots and the indices where a continuous piece of the path starts.
/// </summary>
public sealed class BandPathSample
{
    private readonly Vec3[] _k;
    private readonly double[] _length;
    private readonly string[] _labels;
    private readonly int[] _segmentStarts;

    public BandPathSample(Vec3[] k, double[] length, string[] labels, IReadOnlyList<PathTick> ticks, int[] segmentStarts)
    {
        if (k.Length != length.Length || k.Length != labels.Length)
            throw new ArgumentException("k, length and labels must have the same count.");
        if (segmentStarts.Length == 0 || segmentStarts[0] != 0)
            throw new ArgumentException("the first segment must start at index 0.");
        _k = k; _length = length; _labels = labels; _segmentStarts = segmentStarts; Ticks = ticks;
    }

    public int Count => _k.Length;
    /// <summary>Cartesian wave vectors, inverse angstrom.</summary>
    public IReadOnlyList<Vec3> K => _k;
    /// <summary>Cumulative path length, inverse angstrom.</summary>
    public IReadOnlyList<double> Length => _length;
    /// <summary>Canonical label of each k-point that is a path vertex, "" elsewhere.</summary>
    public IReadOnlyList<string> Labels => _labels;
    public IReadOnlyList<PathTick> Ticks { get; }
    /// <summary>Index of the first k-point of each continuous piece (0 first); lines must not join across pieces.</summary>
    public IReadOnlyList<int> SegmentStarts => _segmentStarts;

    /// <summary>One past the last index of continuous piece <paramref name="segment"/>.</summary>
    public int SegmentEnd(int segment) => segment + 1 < _segmentStarts.Length ? _segmentStarts[segment + 1] : _k.Length;
}
