namespace Meanfield.Lattices;

/// <summary>A vertex of a band path: its label (canonical form, "G" for the zone centre) and Cartesian k in inverse angstrom.</summary>
public sealed record PathPoint(string Label, Vec3 K)
{
    /// <summary>The label as printed in plots (Γ for the zone centre).</summary>
    public string DisplayLabel => HighSymmetryPoints.Display(Label);
}
