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
}
