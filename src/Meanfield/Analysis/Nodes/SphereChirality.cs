using System.Numerics;
using Meanfield.Analysis.Curvature;
using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Nodes;

/// <summary>Berry flux of the occupied bands through a small sphere, in units of 2 pi, and the smallest gap met on it.</summary>
public readonly record struct SphereFlux(double FluxOver2Pi, double MinimumGap)
{
    /// <summary>The nearest integer: the chirality (monopole charge) enclosed.</summary>
    public int Chirality => (int)Math.Round(FluxOver2Pi);
}

/// <summary>
/// Chirality of band touchings by the link-variable method of Fukui, Hatsugai &amp; Suzuki (J. Phys. Soc. Jpn. 74, 1674
/// (2005)) on a theta-phi grid of a sphere around the point. Convention: flux of the Berry curvature of the occupied
/// bands, Omega = curl A with A = i&lt;u|grad_k u&gt;, through the sphere with outward normal, divided by 2 pi. With it
/// H = +v q.sigma (lower band occupied) has chirality +1 (the lower state of B.sigma picks up the Berry phase +Omega/2
/// for solid angle Omega: Berry, Proc. R. Soc. Lond. A 392, 45 (1984)); in general the chirality is sign det v_ij for
/// H = sum_ij q_i v_ij sigma_j.
/// </summary>
public static class SphereChirality
{
    public static SphereFlux Compute(IBlochSource source, Vec3 centre, double radius, int occupied, int nTheta = 24, int nPhi = 48)
    {
        if (occupied < 1 || occupied >= source.Size) throw new ArgumentOutOfRangeException(nameof(occupied));
        if (!(radius > 0)) throw new ArgumentOutOfRangeException(nameof(radius));
        int n = source.Size, block = n * occupied;
        // Rows theta_0 = 0 (north pole) ... theta_nTheta = pi (south pole); the poles are solved once.
        var vecs = new Complex[(nTheta + 1) * nPhi * block];
        double minGap = double.PositiveInfinity;
        var gate = new object();
        Parallel.For(0, nTheta + 1, () => new BlochWorkspace(source), (it, _, ws) =>
        {
            double th = Math.PI * it / nTheta, localMin = double.PositiveInfinity;
            int columns = it == 0 || it == nTheta ? 1 : nPhi;
            for (int ip = 0; ip < columns; ip++)
            {
                double ph = 2 * Math.PI * ip / nPhi;
                var k = centre + radius * new Vec3(Math.Sin(th) * Math.Cos(ph), Math.Sin(th) * Math.Sin(ph), Math.Cos(th));
                ws.Solve(k, true);
                localMin = Math.Min(localMin, ws.Values[occupied] - ws.Values[occupied - 1]);
                var dst = vecs.AsSpan((it * nPhi + ip) * block, block);
                for (int i = 0; i < n; i++)
                    for (int m = 0; m < occupied; m++) dst[i * occupied + m] = ws.Vectors[i * n + m];
            }
            if (columns == 1)
                for (int ip = 1; ip < nPhi; ip++) vecs.AsSpan(it * nPhi * block, block).CopyTo(vecs.AsSpan((it * nPhi + ip) * block, block));
            lock (gate) minGap = Math.Min(minGap, localMin);
            return ws;
        }, _ => { });
        var work = new Complex[occupied * occupied];
        double flux = 0;
        ReadOnlySpan<Complex> V(int it, int ip) => vecs.AsSpan((it * nPhi + ip % nPhi) * block, block);
        for (int it = 0; it < nTheta; it++)
            for (int ip = 0; ip < nPhi; ip++)
            {
                // theta then phi: counter-clockwise about the outward normal (e_theta x e_phi = e_r).
                var u12 = LinkVariable.Overlap(V(it, ip), V(it + 1, ip), n, occupied, occupied, work);
                var u23 = LinkVariable.Overlap(V(it + 1, ip), V(it + 1, ip + 1), n, occupied, occupied, work);
                var u34 = LinkVariable.Overlap(V(it + 1, ip + 1), V(it, ip + 1), n, occupied, occupied, work);
                var u41 = LinkVariable.Overlap(V(it, ip + 1), V(it, ip), n, occupied, occupied, work);
                flux += LinkVariable.PlaquetteFlux(u12, u23, u34, u41);
            }
        return new SphereFlux(flux / (2 * Math.PI), minGap);
    }

    /// <summary>A flux is taken as an integer only within this distance of one (|flux - round(flux)| &lt; 0.05).</summary>
    public const double IntegerTolerance = 0.05;
    /// <summary>The sphere is in the linear cone when the gap on it matches the fitted cone within this fraction.</summary>
    public const double LinearityTolerance = 0.05;
    /// <summary>Largest sphere radius as a fraction of |b|_min, and at most this fraction of the distance to the nearest other node.</summary>
    public const double MaxRadiusFraction = 0.02, NearestNodeFraction = 0.45;

    /// <summary>
    /// The chirality of the touching at <paramref name="centre"/> from a converged flux: the sphere starts at
    /// min(0.02 |b|_min, 0.45 x the distance to the nearest other node), shrinks until the gap met on it matches the
    /// fitted cone (the linear regime, where the link-variable flux is an integer to high accuracy: Fukui, Hatsugai
    /// &amp; Suzuki 2005) and stays above the round-off floor; a flux that is not within 0.05 of an integer is retried on
    /// a finer grid, then a smaller sphere; after that the chirality is undetermined (null), never rounded.
    /// </summary>
    /// <param name="source">The Bloch Hamiltonian.</param>
    /// <param name="centre">The refined node (Cartesian, inverse angstrom).</param>
    /// <param name="nearestNode">Distance to the nearest other node (inverse angstrom; infinity when alone).</param>
    /// <param name="cone">The cone fitted at the node (predicts the gap 2 sqrt(q^T G q) on the sphere).</param>
    /// <param name="occupied">Bands counted as occupied (n_occ).</param>
    /// <param name="tolerances">Scales: |b|_min and the numerical floor.</param>
    public static ChiralityResult Resolve(IBlochSource source, Vec3 centre, double nearestNode, ConeFit cone, int occupied,
                                          SpectrumTolerances tolerances)
    {
        double radius = Math.Min(MaxRadiusFraction * tolerances.ReciprocalLength, NearestNodeFraction * nearestNode);
        var ws = new BlochWorkspace(source);
        bool coneUsable = cone.Singular.Length > 0 && cone.Singular[^1] > 0;
        double floor = 1e3 * tolerances.NumericalFloor;
        for (int shrink = 0; shrink < 8 && coneUsable; shrink++)
        {
            if (Linear(ws, centre, radius, cone, occupied)) break;
            radius /= 4;
        }
        double? lastFlux = null;
        for (int attempt = 0; attempt < 3; attempt++)
        {
            foreach (var (nt, np) in new[] { (24, 48), (48, 96) })
            {
                var s = Compute(source, centre, radius, occupied, nt, np);
                if (!(s.MinimumGap > floor) || !double.IsFinite(s.FluxOver2Pi)) break;
                lastFlux = s.FluxOver2Pi;
                if (Math.Abs(s.FluxOver2Pi - Math.Round(s.FluxOver2Pi)) < IntegerTolerance)
                    return new ChiralityResult(s.Chirality, s.FluxOver2Pi, radius);
            }
            radius /= 4;
        }
        return new ChiralityResult(null, lastFlux, radius);
    }

    // The gap on the sphere along 14 directions agrees with the fitted cone 2 sqrt(q^T G q), G = V^2.
    private static bool Linear(BlochWorkspace ws, Vec3 centre, double radius, ConeFit cone, int occupied)
    {
        Span<Vec3> dirs = stackalloc Vec3[14];
        int d = 0;
        double s3 = 1 / Math.Sqrt(3);
        dirs[d++] = new(1, 0, 0); dirs[d++] = new(-1, 0, 0); dirs[d++] = new(0, 1, 0);
        dirs[d++] = new(0, -1, 0); dirs[d++] = new(0, 0, 1); dirs[d++] = new(0, 0, -1);
        for (int sx = -1; sx <= 1; sx += 2) for (int sy = -1; sy <= 1; sy += 2) for (int sz = -1; sz <= 1; sz += 2)
            dirs[d++] = new(sx * s3, sy * s3, sz * s3);
        var v = cone.Velocity;
        foreach (var u in dirs)
        {
            // |V u| with V the symmetric cone tensor: the predicted half gap per unit length.
            double x = v[0, 0] * u.X + v[0, 1] * u.Y + v[0, 2] * u.Z;
            double y = v[1, 0] * u.X + v[1, 1] * u.Y + v[1, 2] * u.Z;
            double z = v[2, 0] * u.X + v[2, 1] * u.Y + v[2, 2] * u.Z;
            double predicted = 2 * radius * Math.Sqrt(x * x + y * y + z * z);
            double actual = ws.Gap(centre + radius * u, occupied - 1);
            if (!(Math.Abs(actual - predicted) <= LinearityTolerance * predicted)) return false;
        }
        return true;
    }
}

/// <summary>The chirality of one node: an integer from a converged flux, or null (undetermined) with the last flux seen.</summary>
/// <param name="Chirality">Monopole charge, or null when no sphere gave a flux within 0.05 of an integer.</param>
/// <param name="FluxOver2Pi">The flux of the last sphere tried (null when no sphere could be evaluated).</param>
/// <param name="Radius">Radius of that sphere (inverse angstrom).</param>
public readonly record struct ChiralityResult(int? Chirality, double? FluxOver2Pi, double Radius);
