using System.Numerics;
using Meanfield.Analysis.Curvature;
using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Topology;

/// <summary>
/// Hybrid Wannier charge centres on one time-reversal-invariant plane of the zone, as the pumping parameter runs over
/// half the plane, and the Z2 index read from their flow.
/// </summary>
/// <param name="FixedAxis">Reduced axis held fixed (0, 1, 2 for b1, b2, b3).</param>
/// <param name="FixedValue">Its value: 0 or 1/2.</param>
/// <param name="PumpAxis">Reduced axis of the pumping parameter, sampled on [0, 1/2].</param>
/// <param name="LoopAxis">Reduced axis of the Wilson loops (a full period).</param>
/// <param name="Pump">Pumping parameter of each sample, ascending (refined where the flow needed it).</param>
/// <param name="Centres">Centres at each sample, sorted, in [0, 1) (fractions of the lattice vector dual to the loop axis).</param>
/// <param name="Z2">Number of times the largest-gap midpoint is overtaken by a centre, mod 2.</param>
/// <param name="Resolved">Every step passed the clearance test (see <see cref="TopologyTolerances.FlowClearance"/>).</param>
/// <param name="LoopPoints">k-points per Wilson loop.</param>
/// <param name="MinimumLink">Smallest |det| of a Wilson-loop link met.</param>
/// <param name="MinimumGap">Smallest direct gap E_{n_occ} - E_{n_occ - 1} met on the loops (energy unit).</param>
public sealed record WannierFlow(
    int FixedAxis, double FixedValue, int PumpAxis, int LoopAxis, IReadOnlyList<double> Pump,
    IReadOnlyList<double[]> Centres, int Z2, bool Resolved, int LoopPoints, double MinimumLink, double MinimumGap);

/// <summary>
/// Z2 of a time-reversal-invariant plane from the flow of hybrid Wannier charge centres (Wilson-loop eigenphases) across
/// half the plane, by the largest-gap tracking of Soluyanov &amp; Vanderbilt (PRB 83, 235401 (2011), Sec. IV), which
/// is equivalent to counting the crossings of a reference line by the Wilson-loop spectrum (Yu, Qi, Bernevig, Fang &amp;
/// Dai, PRB 84, 075119 (2011)).
/// </summary>
/// <remarks>
/// Wilson loop W = M_0 M_1 ... M_{N-1}, M_j = &lt;u(k_j)|u(k_{j+1})&gt; over the occupied bands, closed with the
/// image (the Bloch phase includes the site positions) u(k + G)_o = e^{-iG.tau_o} u(k)_o, so the eigenphases -arg(lambda) / 2 pi are the centres in
/// units of the lattice vector along the loop, site positions included. A step of the pump from a to b adds the number
/// of centres lying between the gap midpoints z_a and z_b; it is trusted when z_a still sits in a gap at b and z_b at a
/// (clearance), and the count between the midpoints is the same at both ends; otherwise it is halved. Because the
/// occupied bands come in Kramers pairs (an even number of centres), the parity of the count does not depend on which
/// of the two arcs between z_a and z_b is taken.
/// </remarks>
public static class WannierCentreFlow
{
    /// <summary>
    /// The flow on the plane u[fixedAxis] = fixedValue, pump along <paramref name="pumpAxis"/> (initially
    /// <paramref name="pumpSteps"/> steps over [0, 1/2]) and loops of <paramref name="loopPoints"/> points along the
    /// third axis. In 2D use fixedAxis = 2, fixedValue = 0.
    /// </summary>
    /// <exception cref="ArgumentException">Axes not a permutation of 0, 1, 2, or a 2D plane off u3 = 0.</exception>
    /// <exception cref="ArgumentOutOfRangeException">Steps below 2 or loop points below 4, or occupied outside 1..Size-1.</exception>
    public static WannierFlow Compute(IBlochSource source, int occupied, int fixedAxis, double fixedValue, int pumpAxis,
                                      int pumpSteps = 12, int loopPoints = 24)
    {
        int loopAxis = 3 - fixedAxis - pumpAxis;
        if (fixedAxis is < 0 or > 2 || pumpAxis is < 0 or > 2 || fixedAxis == pumpAxis || loopAxis is < 0 or > 2)
            throw new ArgumentException("fixed, pump and loop axes must be a permutation of 0, 1, 2");
        if (source.Model.Lattice.Dimension == 2 && (fixedAxis != 2 || fixedValue != 0))
            throw new ArgumentException("a 2D zone has one plane: fixed axis 2 at 0");
        if (pumpSteps < 2) throw new ArgumentOutOfRangeException(nameof(pumpSteps), "at least 2 pump steps");
        if (loopPoints < 4) throw new ArgumentOutOfRangeException(nameof(loopPoints), "at least 4 loop points");
        if (occupied < 1 || occupied >= source.Size) throw new ArgumentOutOfRangeException(nameof(occupied));

        var loop = new LoopRunner(source, occupied, fixedAxis, fixedValue, pumpAxis, loopAxis, loopPoints);
        var initial = new (double Pump, double[] Centres)[pumpSteps + 1];
        Parallel.For(0, pumpSteps + 1, () => loop.NewBuffers(), (i, _, buf) =>
        {
            double p = 0.5 * i / pumpSteps;
            initial[i] = (p, loop.Centres(p, buf));
            return buf;
        }, _ => { });
        var points = initial.ToList();
        var serial = loop.NewBuffers();
        double smallest = 0.5 / pumpSteps / Math.Pow(2, TopologyTolerances.FlowMaxBisections);
        int crossings = 0;
        bool resolved = true;
        for (int i = 0; i < points.Count - 1;)
        {
            var (pa, ca) = points[i];
            var (pb, cb) = points[i + 1];
            if (Step(ca, cb) is int count) { crossings += count; i++; continue; }
            if (pb - pa <= smallest * 1.000001)
            {
                resolved = false;
                crossings += CountBetween(cb, GapMidpoint(ca).Mid, GapMidpoint(cb).Mid);
                i++;
                continue;
            }
            double mid = 0.5 * (pa + pb);
            points.Insert(i + 1, (mid, loop.Centres(mid, serial)));
        }
        return new WannierFlow(fixedAxis, fixedValue, pumpAxis, loopAxis, points.Select(p => p.Pump).ToArray(),
            points.Select(p => p.Centres).ToArray(), crossings % 2, resolved, loopPoints, loop.MinimumLink, loop.MinimumGap);
    }

    // Centres counted between the midpoints, or null when the step must be refined.
    private static int? Step(double[] ca, double[] cb)
    {
        var (za, ga) = GapMidpoint(ca);
        var (zb, gb) = GapMidpoint(cb);
        double clearance = TopologyTolerances.FlowClearance;
        if (Nearest(cb, za) < clearance * 0.5 * ga || Nearest(ca, zb) < clearance * 0.5 * gb) return null;
        int na = CountBetween(ca, za, zb), nb = CountBetween(cb, za, zb);
        return na == nb ? nb : null;
    }

    /// <summary>Midpoint and width of the largest gap between neighbouring centres on the unit circle.</summary>
    public static (double Mid, double Width) GapMidpoint(double[] sorted)
    {
        int n = sorted.Length;
        double best = sorted[0] + 1 - sorted[n - 1], mid = Wrap(sorted[n - 1] + best / 2);
        for (int i = 0; i + 1 < n; i++)
        {
            double g = sorted[i + 1] - sorted[i];
            if (g > best) { best = g; mid = sorted[i] + g / 2; }
        }
        return (mid, best);
    }

    private static double Nearest(double[] centres, double z)
    {
        double best = double.PositiveInfinity;
        foreach (var c in centres)
        {
            double d = Math.Abs(c - z);
            best = Math.Min(best, Math.Min(d, 1 - d));
        }
        return best;
    }

    private static int CountBetween(double[] centres, double z1, double z2)
    {
        double lo = Math.Min(z1, z2), hi = Math.Max(z1, z2);
        int count = 0;
        foreach (var c in centres) if (c > lo && c < hi) count++;
        return count;
    }

    private static double Wrap(double x) => x - Math.Floor(x);

    /// <summary>Per-thread buffers of one Wilson loop.</summary>
    internal sealed class LoopBuffers(IBlochSource source, int points, int occupied)
    {
        public readonly BlochWorkspace Workspace = new(source);
        public readonly Complex[] Vectors = new Complex[(points + 1) * source.Size * occupied];
        public readonly Complex[] Link = new Complex[occupied * occupied];
        public readonly Complex[] Product = new Complex[occupied * occupied];
        public readonly Complex[] Next = new Complex[occupied * occupied];
        public readonly Complex[] Scratch = new Complex[occupied * occupied];
    }

    private sealed class LoopRunner(IBlochSource source, int occupied, int fixedAxis, double fixedValue, int pumpAxis, int loopAxis, int points)
    {
        private readonly object _gate = new();
        public double MinimumLink { get; private set; } = 1;
        public double MinimumGap { get; private set; } = double.PositiveInfinity;

        public LoopBuffers NewBuffers() => new(source, points, occupied);

        /// <summary>Sorted centres in [0, 1) of the Wilson loop at pump value p.</summary>
        public double[] Centres(double p, LoopBuffers buf)
        {
            var model = source.Model;
            var lattice = model.Lattice;
            int n = source.Size, occ = occupied, block = n * occ, f = model.Flavours;
            double minGap = double.PositiveInfinity, minLink = 1;
            var u = new double[3];
            for (int j = 0; j < points; j++)
            {
                u[fixedAxis] = fixedValue; u[pumpAxis] = p; u[loopAxis] = (double)j / points;
                buf.Workspace.Solve(lattice.Cartesian(u[0], u[1], u[2]), true);
                minGap = Math.Min(minGap, buf.Workspace.Values[occ] - buf.Workspace.Values[occ - 1]);
                var dst = buf.Vectors.AsSpan(j * block, block);
                for (int a = 0; a < n; a++)
                    for (int m = 0; m < occ; m++) dst[a * occ + m] = buf.Workspace.Vectors[a * n + m];
            }
            // Closing point: u(k + G)_o = exp(-i G.tau_o) u(k)_o with G the reciprocal vector along the loop.
            var gv = loopAxis == 0 ? lattice.B1 : loopAxis == 1 ? lattice.B2 : lattice.B3;
            for (int a = 0; a < n; a++)
            {
                var tau = model.Sites[model.Orbitals[a / f].Site].Position;
                var phase = Complex.FromPolarCoordinates(1, -gv.Dot(tau));
                for (int m = 0; m < occ; m++) buf.Vectors[points * block + a * occ + m] = phase * buf.Vectors[a * occ + m];
            }
            Array.Clear(buf.Product);
            for (int m = 0; m < occ; m++) buf.Product[m * occ + m] = 1;
            for (int j = 0; j < points; j++)
            {
                var va = buf.Vectors.AsSpan(j * block, block);
                var vb = buf.Vectors.AsSpan((j + 1) * block, block);
                for (int m = 0; m < occ; m++)
                    for (int q = 0; q < occ; q++)
                    {
                        Complex s = 0;
                        for (int a = 0; a < n; a++) s += Complex.Conjugate(va[a * occ + m]) * vb[a * occ + q];
                        buf.Link[m * occ + q] = s;
                    }
                buf.Link.CopyTo(buf.Scratch, 0);
                minLink = Math.Min(minLink, LinkVariable.Determinant(buf.Scratch, occ).Magnitude);
                for (int m = 0; m < occ; m++)
                    for (int q = 0; q < occ; q++)
                    {
                        Complex s = 0;
                        for (int r = 0; r < occ; r++) s += buf.Product[m * occ + r] * buf.Link[r * occ + q];
                        buf.Next[m * occ + q] = s;
                    }
                buf.Next.CopyTo(buf.Product, 0);
            }
            var w = MathNet.Numerics.LinearAlgebra.Matrix<Complex>.Build.Dense(occ, occ, (i, j) => buf.Product[i * occ + j]);
            var centres = w.Evd().EigenValues.Select(l => Wrap(-l.Phase / (2 * Math.PI))).Select(c => c >= 1 ? 0 : c).ToArray();
            Array.Sort(centres);
            lock (_gate) { MinimumGap = Math.Min(MinimumGap, minGap); MinimumLink = Math.Min(MinimumLink, minLink); }
            return centres;
        }
    }
}
