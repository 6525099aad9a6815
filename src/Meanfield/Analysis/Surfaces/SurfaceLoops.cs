using System.Numerics;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>Whether a loop count could be made.</summary>
public enum LoopVerdict
{
    /// <summary>The bulk is gapped at the energy all along the loop and every decimation converged.</summary>
    Decided,
    /// <summary>Every loop tried meets projected bulk states at the energy (or too close to resolve): no count.</summary>
    BulkGapless,
    /// <summary>A decimation on the loop did not converge: no count.</summary>
    NotConverged,
}

/// <summary>A surface state crossing the counting energy on a loop: where, and whether it rises (up) as the loop advances.</summary>
public sealed record LoopCrossing(Vec3 K, bool Up, double TopWeight);

/// <summary>
/// The signed count of top-surface states crossing <paramref name="Energy"/> on a circle of <paramref name="Radius"/>
/// around <paramref name="Centre"/>, walked counter-clockwise seen from outside the top face. <paramref name="Clearance"/>
/// is the smallest distance of the projected bulk spectrum from the energy on the loop, <paramref name="Eta"/> the
/// broadening used. Counts are meaningful only when <paramref name="Verdict"/> is Decided.
/// </summary>
public sealed record LoopCount(int Node, Vec3 Centre, double Radius, double Energy, double Clearance, double Eta,
                               int Up, int Down, LoopVerdict Verdict, IReadOnlyList<LoopCrossing> Crossings)
{
    /// <summary>Up minus down crossings (0 unless decided).</summary>
    public int Net => Up - Down;
}

/// <summary>
/// The bulk-boundary correspondence of Weyl semimetals (Wan, Turner, Vishwanath &amp; Savrasov, PRB 83, 205101 (2011)):
/// on a closed loop in the surface zone along which the bulk is gapped at E, the top-surface states cross E a net number
/// of times (up minus down, counter-clockwise seen from outside) equal to the net chirality of the nodes projected inside.
/// <para>
/// Counted from the semi-infinite crystal, not a slab (heavy surface states decay over hundreds of layers near a node):
/// F(k) = Tr G_s(k, E + i eta) over the top principal layer. A surface state E_s(k) crossing E is a pole,
/// F ~ w / (E - E_s + i eta), so Re F changes sign from + to - where E_s rises through E (an up crossing) and from - to +
/// where it falls, with -eta Im F = w its top-layer weight there; smooth zeros of Re F carry a weight of order
/// (eta / clearance)^2 and are not crossings. Loop radius, clearance, eta and the weight threshold are the named
/// fractions of <see cref="SurfaceTolerances"/>.
/// </para>
/// </summary>
public static class SurfaceLoops
{
    /// <summary>
    /// Counts around projected node <paramref name="index"/>: circles of the radii of
    /// <see cref="SurfaceTolerances.LoopRadiusFractions"/> (largest first) until one keeps the bulk at least
    /// <see cref="SurfaceTolerances.MinClearanceFraction"/> x <paramref name="scale"/> away from the energy; "cannot be
    /// decided" (<see cref="LoopVerdict.BulkGapless"/>) when none does; each radius is tried centred on the node and then
    /// moved off it by <see cref="SurfaceTolerances.LoopShiftFraction"/> of the radius. A single projected node is given a loop of
    /// <see cref="SurfaceTolerances.LoopRadiusFractions"/>[0] x |b|_min.
    /// </summary>
    public static LoopCount Around(SurfaceCut cut, IReadOnlyList<ProjectedNode> nodes, int index, double energy, double scale)
    {
        var zone = cut.Zone;
        var centre = nodes[index].KPar;
        double separation = Math.Min(zone.B1.Norm, zone.B2.Norm);
        for (int j = 0; j < nodes.Count; j++)
            if (j != index) separation = Math.Min(separation, Folded(zone, nodes[j].KPar - centre));
        LoopCount? last = null;
        foreach (double f in SurfaceTolerances.LoopRadiusFractions)
        {
            double radius = f * separation;
            // Centred first, then moved by LoopShiftFraction x radius along +-e1, +-e2: the node stays inside and, with
            // radius at most 0.3 of the separation, every other projected node stays outside.
            foreach (var (u, v) in new[] { (0, 0), (1, 0), (0, 1), (-1, 0), (0, -1) })
            {
                var at = centre + SurfaceTolerances.LoopShiftFraction * radius * (u * zone.E1 + v * zone.E2);
                var c = OnCircle(cut, at, radius, energy, scale) with { Node = index };
                if (c.Verdict == LoopVerdict.Decided) return c;
                last = c;
            }
        }
        return last!;
    }

    /// <summary>The count on one circle (<see cref="SurfaceTolerances.LoopPoints"/> points); Node is -1.</summary>
    public static LoopCount OnCircle(SurfaceCut cut, Vec3 centre, double radius, double energy, double scale)
    {
        var loop = SurfaceStateCounting.Circle(cut.Zone, centre, radius, SurfaceTolerances.LoopPoints);
        var bulk = new ProjectedBulk(cut);
        double clearance = double.PositiveInfinity;
        int worst = 0;
        for (int i = 0; i < loop.Length; i++)
        {
            double d = bulk.Clearance(loop[i], energy);
            if (d < clearance) { clearance = d; worst = i; }
        }
        // The minimum between samples: golden-section in the loop angle around the worst sample.
        clearance = Math.Min(clearance, RefineClearance(bulk, cut.Zone, centre, radius, worst, loop.Length, energy));
        double eta = Math.Min(LowEnergyScale.DefaultEtaFraction * scale, SurfaceTolerances.EtaPerClearance * clearance);
        if (!(clearance >= SurfaceTolerances.MinClearanceFraction * scale))
            return new LoopCount(-1, centre, radius, energy, clearance, eta, 0, 0, LoopVerdict.BulkGapless, []);
        var probe = new PoleProbe(cut, energy, eta);
        var values = new Complex[loop.Length];
        bool converged = true;
        for (int i = 0; i < loop.Length; i++) converged &= probe.Trace(loop[i], out values[i]);
        var crossings = new List<LoopCrossing>();
        for (int i = 0; i < loop.Length && converged; i++)
        {
            var a = loop[i]; var b = loop[(i + 1) % loop.Length];
            var fa = values[i]; var fb = values[(i + 1) % loop.Length];
            if (probe.Locate(a, fa, b, fb, out var k, out double weight, ref converged)) crossings.Add(new LoopCrossing(k, fa.Real > 0, weight));
        }
        if (!converged) return new LoopCount(-1, centre, radius, energy, clearance, eta, 0, 0, LoopVerdict.NotConverged, []);
        int up = crossings.Count(c => c.Up);
        return new LoopCount(-1, centre, radius, energy, clearance, eta, up, crossings.Count - up, LoopVerdict.Decided, crossings);
    }

    private static double RefineClearance(ProjectedBulk bulk, SurfaceZone zone, Vec3 centre, double radius, int worst, int points, double energy)
    {
        double Point(double angle) => bulk.Clearance(centre + radius * Math.Cos(angle) * zone.E1 + radius * Math.Sin(angle) * zone.E2, energy);
        double step = 2 * Math.PI / points, a = 2 * Math.PI * (worst - 0.5) / points, b = a + 2 * step, g = 0.5 * (Math.Sqrt(5) - 1);
        double c = b - g * (b - a), d = a + g * (b - a), fc = Point(c), fd = Point(d);
        for (int it = 0; it < 20; it++)
        {
            if (fc < fd) { b = d; d = c; fd = fc; c = b - g * (b - a); fc = Point(c); }
            else { a = c; c = d; fc = fd; d = a + g * (b - a); fd = Point(d); }
        }
        return Math.Min(fc, fd);
    }

    internal static double Folded(SurfaceZone zone, Vec3 d) => zone.Project(d).Norm;

    /// <summary>Tr G_s of the top principal layer at one energy, and the location of its surface poles.</summary>
    internal sealed class PoleProbe(SurfaceCut cut, double energy, double eta)
    {
        private readonly SurfaceSpectra.Worker _worker = new(cut, null);
        private readonly Complex _z = new(energy, eta);
        public double Eta => eta;

        /// <summary>F = Tr G_s(k, E + i eta); false when the decimation did not converge.</summary>
        public bool Trace(Vec3 k, out Complex f)
        {
            _worker.Prepare(k);
            var r = _worker.Solve(_z);
            var g = _worker.Decimation.Surface;
            int n = cut.BlockSize;
            f = 0;
            for (int i = 0; i < n; i++) f += g[i * n + i];
            return r.Converged;
        }

        /// <summary>
        /// When Re F changes sign between a and b: bisects to the sign change and reports it (true) if it is a surface
        /// pole, with the top-layer weight -eta Im F there.
        /// </summary>
        public bool Locate(Vec3 a, Complex fa, Vec3 b, Complex fb, out Vec3 k, out double weight, ref bool converged)
        {
            k = a; weight = 0;
            if (Math.Sign(fa.Real) == Math.Sign(fb.Real)) return false;
            for (int it = 0; it < SurfaceTolerances.Bisections; it++)
            {
                var m = 0.5 * (a + b);
                converged &= Trace(m, out var fm);
                if (Math.Sign(fm.Real) == Math.Sign(fa.Real)) { a = m; fa = fm; } else { b = m; fb = fm; }
            }
            k = 0.5 * (a + b);
            converged &= Trace(k, out var fk);
            weight = -eta * fk.Imaginary;
            return weight > SurfaceTolerances.PoleWeight;
        }
    }
}
