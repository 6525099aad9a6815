namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// Every tolerance of the loop count and of arc tracing, in one place and relative to the scale it judges: energies to
/// the heavy-band scale W of <see cref="LowEnergyScale"/> (or to the bulk clearance on the loop, itself bounded below by
/// a fraction of W), distances in k to the separation of projected nodes or to the shortest surface reciprocal vector.
/// Heavy bands are ~1e-3 of the total bandwidth, so nothing here refers to the total bandwidth (common practice).
/// </summary>
public static class SurfaceTolerances
{
    /// <summary>Loop radii tried around a projected node, largest first, as fractions of the distance to the nearest
    /// other projected node (folded over the surface zone): every loop encloses that node and no other.</summary>
    public static IReadOnlyList<double> LoopRadiusFractions { get; } = [0.3, 0.2, 0.12, 0.07, 0.04];
    /// <summary>A loop that meets bulk states is also tried moved off the node by this fraction of its radius (the node
    /// stays inside; with radii at most 0.3 of the separation no other node comes inside).</summary>
    public const double LoopShiftFraction = 0.5;
    /// <summary>A loop is used only when the projected bulk spectrum stays at least this fraction of W away from the
    /// counting energy all along it; otherwise a smaller loop is tried, and the count is "cannot be decided" when none
    /// qualifies.</summary>
    public const double MinClearanceFraction = 1e-4;
    /// <summary>Broadening of the counting Green function as a fraction of the smallest bulk clearance on the loop (so
    /// surface poles stand far above the bulk tails), capped at <see cref="LowEnergyScale.DefaultEtaFraction"/> x W.</summary>
    public const double EtaPerClearance = 0.02;
    /// <summary>A sign change of Re Tr G_s along the loop is a surface state crossing the energy when its top-layer
    /// weight, -eta Im Tr G_s at the sign change, exceeds this (a smooth zero of Re Tr G_s has a weight of order
    /// (eta / clearance)^2).</summary>
    public const double PoleWeight = 1e-3;
    /// <summary>Points on a counting loop (each step with a sign change is bisected <see cref="Bisections"/> times).</summary>
    public const int LoopPoints = 256;
    /// <summary>Bisections that locate a sign change of Re Tr G_s.</summary>
    public const int Bisections = 30;
    /// <summary>Arc-tracing step as a fraction of the shortest surface reciprocal vector; halved down to
    /// <see cref="ArcMinStepFraction"/> where the arc turns sharply.</summary>
    public const double ArcStepFraction = 0.005;
    /// <summary>Smallest arc-tracing step (fraction of the shortest surface reciprocal vector).</summary>
    public const double ArcMinStepFraction = 1e-4;
    /// <summary>Longest arc traced, in shortest surface reciprocal vectors.</summary>
    public const double ArcMaxLength = 3;
}
