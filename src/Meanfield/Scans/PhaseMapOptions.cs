namespace Meanfield.Scans;

/// <summary>Appearance of a phase map.</summary>
public sealed record PhaseMapOptions
{
    /// <summary>Numeric column drawn as contour lines over the map (for example "r_f" or "direct_gap"); null for none.</summary>
    public string? ContourColumn { get; init; }
    public int ContourLevels { get; init; } = 8;
    public int Width { get; init; } = 900;
    public int Height { get; init; } = 700;
    public string? Title { get; init; }
}
