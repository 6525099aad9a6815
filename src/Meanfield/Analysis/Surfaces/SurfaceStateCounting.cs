using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>Signed crossings of an energy by top-surface states along a closed loop.</summary>
/// <param name="Net">Upward crossings minus downward ones while the loop is walked in the given order.</param>
/// <param name="Up">Upward crossings (the state's energy rises through E as the loop advances).</param>
/// <param name="Down">Downward crossings.</param>
/// <param name="Ambiguous">Steps whose count changes did not pair into crossings even after subdivision (reported, not
/// counted): the loop is too coarse, or the slab too thin for its surface states.</param>
public sealed record LoopCrossings(int Net, int Up, int Down, int Ambiguous);

/// <summary>A Kramers-degenerate top-surface state inside the projected bulk gap at a surface TRIM: a surface Dirac point.</summary>
public sealed record SurfaceDiracPoint(string Label, Vec3 KPar, double Energy, double TopWeight);

/// <summary>
/// Counting surface states of a slab: signed crossings of an energy along a loop in k_par (the bulk-boundary
/// correspondence of Weyl semimetals: the net count around a projected node equals the net chirality projected inside,
/// Wan, Turner, Vishwanath &amp; Savrasov, PRB 83, 205101 (2011)), and the surface Dirac points at the surface TRIM
/// (an odd number on every face of a strong topological insulator: Fu, Kane &amp; Mele, PRL 98, 106803 (2007)).
/// A state is on the top face when its weight on the top <c>faceDepth</c> principal layers exceeds
/// <see cref="FaceThreshold"/>. The slab count needs surface states that decay well inside the slab; heavy surface
/// states near a node decay over hundreds of layers, so the arc view counts from the semi-infinite crystal instead
/// (<see cref="SurfaceLoops"/>).
/// </summary>
public static class SurfaceStateCounting
{
    /// <summary>Face weight above which a slab state counts as a surface state of that face.</summary>
    public const double FaceThreshold = 0.6;
    /// <summary>Bisections of a loop step whose count changes do not pair up.</summary>
    public const int MaxSubdivisions = 6;
    /// <summary>Two slab levels within this fraction of the projected gap form a Kramers pair.</summary>
    public const double KramersTolerance = 1e-4;

    /// <summary>
    /// Walks the closed loop (the last point joins the first) and counts top-surface states crossing
    /// <paramref name="energy"/>: states within <paramref name="window"/> of it are tracked; a crossing is a step where
    /// the top states below E drop by one and those above rise by one (up) or the reverse (down); a step with any
    /// other change of both counts is bisected. Choose the window inside the projected bulk gap along the loop, where
    /// the surface states are well localized.
    /// </summary>
    public static LoopCrossings CountAlongLoop(Slab slab, IReadOnlyList<Vec3> loop, double energy, double window, int faceDepth)
    {
        var worker = new SlabBands.Worker(slab);
        (int Below, int Above) Census(Vec3 k)
        {
            worker.Solve(k);
            int below = 0, above = 0;
            // Levels degenerate within the tolerance mix the faces (top and bottom states meeting at one k): count
            // the face weight of the cluster, floor(sum + 1 - threshold) states, so one state needs the threshold.
            for (int m = 0; m < slab.Size;)
            {
                int end = m + 1;
                while (end < slab.Size && worker.Values[end] - worker.Values[end - 1] <= KramersTolerance * window) end++;
                double e = 0.5 * (worker.Values[m] + worker.Values[end - 1]), top = 0;
                if (Math.Abs(e - energy) <= window)
                    for (int i = m; i < end; i++) top += slab.FaceWeights(worker.Vectors, i, faceDepth).Top;
                int count = (int)Math.Floor(top + 1 - FaceThreshold);
                if (e < energy) below += count; else above += count;
                m = end;
            }
            return (below, above);
        }
        int up = 0, down = 0, ambiguous = 0;
        void Step(Vec3 a, (int, int) ca, Vec3 b, (int, int) cb, int depth)
        {
            int dBelow = cb.Item1 - ca.Item1, dAbove = cb.Item2 - ca.Item2;
            // One state passing E: below and above change oppositely by one. A change of only one side is a state
            // entering or leaving the window (or its face weight crossing the threshold): not a crossing.
            if (dBelow == 0 || dAbove == 0) return;
            if (Math.Abs(dBelow) == 1 && dBelow == -dAbove) { if (dAbove > 0) up++; else down++; return; }
            if (depth >= MaxSubdivisions)
            {
                ambiguous++;
                if (Math.Sign(dBelow) != Math.Sign(dAbove)) { int m = Math.Min(Math.Abs(dBelow), Math.Abs(dAbove)); if (dAbove > 0) up += m; else down += m; }
                return;
            }
            var mid = 0.5 * (a + b);
            var cm = Census(mid);
            Step(a, ca, mid, cm, depth + 1);
            Step(mid, cm, b, cb, depth + 1);
        }
        var first = Census(loop[0]);
        var prev = first;
        for (int i = 1; i <= loop.Count; i++)
        {
            var k = loop[i % loop.Count];
            var c = i == loop.Count ? first : Census(k);
            Step(loop[i - 1], prev, k, c, 0);
            prev = c;
        }
        return new LoopCrossings(up - down, up, down, ambiguous);
    }

    /// <summary>A circle of <paramref name="points"/> in-plane points around <paramref name="centre"/>, counter-clockwise
    /// seen from outside the top face (from +normal), starting half a step past the e1 axis so that points avoid the
    /// symmetric directions where top and bottom states often meet.</summary>
    public static Vec3[] Circle(SurfaceZone zone, Vec3 centre, double radius, int points)
    {
        var loop = new Vec3[points];
        for (int i = 0; i < points; i++)
        {
            double a = 2 * Math.PI * (i + 0.5) / points;
            loop[i] = centre + radius * Math.Cos(a) * zone.E1 + radius * Math.Sin(a) * zone.E2;
        }
        return loop;
    }

    /// <summary>
    /// Surface Dirac points of the top face: at each surface TRIM, Kramers pairs of slab levels inside the projected
    /// bulk gap between the lowest <paramref name="occupiedPerLayer"/> bands of a principal layer and the rest, with
    /// top weight (of the pair, per state) above <see cref="FaceThreshold"/>.
    /// </summary>
    public static IReadOnlyList<SurfaceDiracPoint> DiracPoints(Slab slab, int occupiedPerLayer, int faceDepth)
    {
        var worker = new SlabBands.Worker(slab);
        var bulk = new ProjectedBulk(slab.Cut);
        var found = new List<SurfaceDiracPoint>();
        foreach (var (label, k) in slab.Cut.Zone.InvariantMomenta)
        {
            var (lower, upper) = bulk.Gap(k, occupiedPerLayer);
            if (upper <= lower) continue;
            double tol = KramersTolerance * (upper - lower);
            worker.Solve(k);
            // Clusters of levels within tol: a top pair, or top and bottom pairs that happen to be degenerate (their
            // eigenvectors then mix the faces, so count the cluster's face weights, not single states).
            for (int m = 0; m < slab.Size;)
            {
                int end = m + 1;
                while (end < slab.Size && worker.Values[end] - worker.Values[end - 1] <= tol) end++;
                int c = end - m;
                double e = 0.5 * (worker.Values[m] + worker.Values[end - 1]);
                if (c >= 2 && e > lower && e < upper)
                {
                    double top = 0, bottom = 0;
                    for (int i = m; i < end; i++)
                    {
                        var (t, b) = slab.FaceWeights(worker.Vectors, i, faceDepth);
                        top += t; bottom += b;
                    }
                    int pairs = top / c >= FaceThreshold ? c / 2
                        : top + bottom >= FaceThreshold * c ? (int)Math.Round(0.5 * c * top / (top + bottom)) : 0;
                    for (int p = 0; p < pairs; p++) found.Add(new SurfaceDiracPoint(label, k, e, top / c));
                }
                m = end;
            }
        }
        return found;
    }
}
