using System.Globalization;
using Meanfield.Lattices;
using Meanfield.Solutions;

namespace Meanfield.Analysis.Curvature;

/// <summary>
/// Which parallelogram of the zone to map: k = corner + s side_a + t side_b with s, t in [0, 1], all in reduced
/// coordinates (units of the reciprocal basis).
/// </summary>
public sealed record CurvatureRequest
{
    /// <summary>Largest plaquette count per side accepted (memory grows with its square).</summary>
    public const int MaxGrid = 1000;

    /// <summary>The corner the two sides start from.</summary>
    public required Vec3 Corner { get; init; }
    /// <summary>First side.</summary>
    public required Vec3 SideA { get; init; }
    /// <summary>Second side (not parallel to the first).</summary>
    public required Vec3 SideB { get; init; }
    /// <summary>Plaquettes along each side, 2..<see cref="MaxGrid"/> (default 48).</summary>
    public int Grid { get; init; } = 48;
    /// <summary>Coarse mesh of the node search that marks the nodes in the plane (default 12).</summary>
    public int SearchMesh { get; init; } = 12;
    /// <summary>Tolerance of "a node lies in the plane", as a fraction of the shortest reciprocal basis vector.</summary>
    public const double InPlaneTolerance = 1e-4;

    /// <summary>Checks what can be checked before any model is solved: the grid and that the sides span a plane.</summary>
    /// <exception cref="RequestError">A grid outside 2..<see cref="MaxGrid"/>, or parallel or zero sides.</exception>
    public void Validate()
    {
        if (Grid < 2 || Grid > MaxGrid) throw new RequestError($"--grid {Grid}: use 2..{MaxGrid} plaquettes per side");
        // The reduced-to-Cartesian map is invertible, so parallel reduced sides are parallel in k-space too.
        if (!(SideA.Cross(SideB).Norm > 1e-10 * Math.Max(SideA.Norm * SideB.Norm, 1e-300)))
            throw new RequestError($"--sides {SideA} {SideB}: the sides are parallel or zero, so the parallelogram does not cut the zone");
    }
}

/// <summary>The Berry curvature of the occupied bands on a parallelogram, with the nodes lying in it.</summary>
/// <param name="Map">Curvature per plaquette, total flux and (on a full torus) the Chern number.</param>
/// <param name="NodesInPlane">The band touchings inside the parallelogram, at plane coordinates.</param>
/// <param name="Occupied">Bands whose curvature is summed (the lowest, from the electron count).</param>
/// <param name="Metal">True when the two bands at the filling overlap away from the nodes: then the sum is not that of the occupied states.</param>
public sealed record CurvatureStudyResult(BerryCurvatureMap Map, IReadOnlyList<PlaneNode> NodesInPlane, int Occupied, bool Metal)
{
    /// <summary>"(s=0.2500 t=0.5000 chirality=+1) ...": the nodes in the plane, for tables and the terminal.</summary>
    public string NodesText => string.Join(" ", NodesInPlane.Select(p => string.Create(CultureInfo.InvariantCulture,
        $"(s={p.S:F4} t={p.T:F4} chirality={(p.Chirality is { } c ? c.ToString("+0;-0;0", CultureInfo.InvariantCulture) : "undetermined")})")));
}

/// <summary>The one entry point of a curvature map: the plaquette fluxes and the node search that marks its nodes.</summary>
public static class CurvatureStudy
{
    /// <summary>Maps the curvature of the solution's <see cref="Solution.OccupiedBands"/> lowest bands.</summary>
    /// <exception cref="RequestError">A momentum-free model, a plane leaving the 2D zone, parallel or zero sides, a grid outside 2..1000, or a filling that leaves no band pair.</exception>
    public static CurvatureStudyResult Run(Solution solution, CurvatureRequest request)
    {
        var model = solution.Model;
        if (model.IsMomentumFree) throw new RequestError($"{model.SourcePath}: a momentum-free lattice has no Berry curvature");
        if (!solution.WholeFilling) throw new RequestError($"{model.SourcePath}: the curvature of the occupied bands needs a whole number of filled bands");
        request.Validate();
        var (o, a, b) = (request.Corner, request.SideA, request.SideB);
        if (model.Lattice.Dimension == 2 && (o.Z != 0 || a.Z != 0 || b.Z != 0))
            throw new RequestError($"{model.Name} is two-dimensional: the third reduced component of the corner and sides must be 0");
        int occ = solution.OccupiedBands;
        var map = BerryCurvature.Compute(solution.Hamiltonian, o, a, b, request.Grid, request.Grid, occ);
        var nodes = SpectrumSummary.Compute(solution, new SpectrumRequest { SearchMesh = request.SearchMesh, Dos = false, Heat = false, Topology = false }).Nodes!;
        double bMin = Math.Min(model.Lattice.B1.Norm, model.Lattice.B2.Norm);
        var inPlane = PlaneNodes.Find(model.Lattice, o, a, b, nodes.Nodes, CurvatureRequest.InPlaneTolerance * bMin);
        return new CurvatureStudyResult(map, inPlane, occ, nodes.FermiSurfaceAwayFromNodes);
    }
}
