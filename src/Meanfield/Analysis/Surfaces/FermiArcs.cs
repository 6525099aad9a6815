using System.Numerics;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// One Fermi arc traced from the loop around projected node <paramref name="From"/>: it ends on the loop of node
/// <paramref name="To"/> (null when it could not be followed; <paramref name="Unresolved"/> says why). Points are map
/// coordinates (s1, s2) in 1/angstrom, folded into the surface zone, in tracing order; <paramref name="BothEnds"/> is
/// true when tracing from the other end found the same pair.
/// </summary>
public sealed record FermiArc(int From, int? To, IReadOnlyList<(double S1, double S2)> Points, bool BothEnds, string? Unresolved);

/// <summary>
/// Which projected nodes each Fermi arc joins: from every surface-state crossing found on a decided loop
/// (<see cref="SurfaceLoops"/>), the arc is followed outward as the line of surface poles of G_s at the counting energy
/// (predictor step along the arc, corrector by bisection of the sign change of Re Tr G_s across it) until it enters the
/// loop of another projected node. Two arcs that cross or nearly touch in a map are told apart this way, since each
/// trace stays on one pole line. Arcs join projections of opposite chirality (Wan, Turner, Vishwanath &amp; Savrasov,
/// PRB 83, 205101 (2011)); a trace that loses the pole line or meets bulk states at the energy is reported unresolved.
/// </summary>
public static class FermiArcs
{
    /// <summary>Traces an arc from each crossing of each decided loop, then pairs traces run from both ends.</summary>
    public static IReadOnlyList<FermiArc> Trace(SurfaceCut cut, IReadOnlyList<ProjectedNode> nodes, IReadOnlyList<LoopCount> loops, double scale)
    {
        var starts = new List<(int Node, LoopCrossing Crossing)>();
        foreach (var l in loops)
            if (l.Verdict == LoopVerdict.Decided)
                foreach (var c in l.Crossings) starts.Add((l.Node, c));
        var traced = new FermiArc[starts.Count];
        Parallel.For(0, starts.Count, i => traced[i] = Follow(cut, nodes, loops, starts[i].Node, starts[i].Crossing, scale));
        // An arc traced from both of its ends appears twice: keep one, marked as confirmed from both ends.
        var used = new bool[traced.Length];
        var arcs = new List<FermiArc>();
        for (int i = 0; i < traced.Length; i++)
        {
            if (used[i]) continue;
            used[i] = true;
            var a = traced[i];
            int partner = -1;
            if (a.To is int to && to != a.From)
                for (int j = i + 1; j < traced.Length && partner < 0; j++)
                    if (!used[j] && traced[j].From == to && traced[j].To == a.From) partner = j;
            if (partner >= 0) { used[partner] = true; a = a with { BothEnds = true }; }
            arcs.Add(a);
        }
        return arcs;
    }

    private static FermiArc Follow(SurfaceCut cut, IReadOnlyList<ProjectedNode> nodes, IReadOnlyList<LoopCount> loops, int from, LoopCrossing start, double scale)
    {
        var zone = cut.Zone;
        var home = loops.First(l => l.Node == from);
        var probe = new SurfaceLoops.PoleProbe(cut, home.Energy, home.Eta);
        var bulk = new ProjectedBulk(cut);
        double b = Math.Min(zone.B1.Norm, zone.B2.Norm);
        double h0 = SurfaceTolerances.ArcStepFraction * b, hMin = SurfaceTolerances.ArcMinStepFraction * b;
        var points = new List<(double, double)> { Fold(zone, start.K) };
        var p = start.K;
        var t = Unit(start.K - home.Centre);
        double h = h0, length = 0;
        bool converged = true;
        while (length < SurfaceTolerances.ArcMaxLength * b)
        {
            var guess = p + h * t;
            var n = zone.Plane.Normal.Cross(t);
            var a = guess - h * n; var c = guess + h * n;
            converged &= probe.Trace(a, out var fa);
            converged &= probe.Trace(c, out var fc);
            if (!converged) return new FermiArc(from, null, points, false, "a decimation did not converge on the arc");
            if (!probe.Locate(a, fa, c, fc, out var q, out _, ref converged))
            {
                h *= 0.5;
                if (h < hMin) return new FermiArc(from, null, points, false, $"the arc was lost near ({points[^1].Item1:F4}, {points[^1].Item2:F4}) 1/angstrom");
                continue;
            }
            if (bulk.Clearance(q, home.Energy) < SurfaceTolerances.MinClearanceFraction * scale)
                return new FermiArc(from, null, points, false, $"the arc meets bulk states near ({points[^1].Item1:F4}, {points[^1].Item2:F4}) 1/angstrom");
            length += (q - p).Norm;
            t = Unit(q - p);
            p = q;
            points.Add(Fold(zone, q));
            h = Math.Min(h0, 1.5 * h);
            // Ends where it enters the loop of a projected node (its own only after leaving it).
            foreach (var l in loops)
            {
                double r = SurfaceLoops.Folded(zone, q - l.Centre);
                if (r < l.Radius && (l.Node != from || length > 2 * home.Radius))
                {
                    points.Add(Fold(zone, nodes[l.Node].KPar));
                    return new FermiArc(from, l.Node, points, false, null);
                }
            }
        }
        return new FermiArc(from, null, points, false, "the arc did not reach another projected node");
    }

    private static Vec3 Unit(Vec3 v) => v / v.Norm;

    private static (double, double) Fold(SurfaceZone zone, Vec3 k) => zone.MapCoordinates(zone.Project(k));
}
