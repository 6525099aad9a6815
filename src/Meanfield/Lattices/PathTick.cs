namespace Meanfield.Lattices;

/// <summary>
/// A labelled position on the horizontal axis of a band plot. At a break in the path the two labels are joined as
/// "X|M" and <see cref="Index"/> is the first k-point after the break.
/// </summary>
/// <param name="Index">Index of the k-point in the sample.</param>
/// <param name="Position">Cumulative path length in inverse angstrom.</param>
/// <param name="Label">Canonical label(s), for example "G" or "X|M".</param>
public readonly record struct PathTick(int Index, double Position, string Label)
{
    /// <summary>The label as printed in plots, with Γ for the zone centre.</summary>
    public string DisplayLabel => string.Join("|", Label.Split('|').Select(HighSymmetryPoints.Display));
}
