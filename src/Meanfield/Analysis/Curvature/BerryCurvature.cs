using System.Numerics;
using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Curvature;

/// <summary>
/// Berry curvature of the occupied bands on a plane k = origin + s span1 + t span2 (reduced coordinates, s, t in
/// [0, 1]) by the plaquette (link-variable) method of Fukui, Hatsugai &amp; Suzuki, J. Phys. Soc. Jpn. 74, 1674 (2005).
/// Sign: flux of curl A, A = i&lt;u|grad u&gt;, along span1 x span2. With the Bloch phase of
/// <see cref="BlochHamiltonian"/> (site positions included), u(k + G)_i = exp(-i G.tau_i) u(k)_i closes a full-torus plane exactly.
/// </summary>
public static class BerryCurvature
{
    public static BerryCurvatureMap Compute(IBlochSource source, Vec3 origin, Vec3 span1, Vec3 span2, int n1, int n2, int occupied)
    {
        var model = source.Model;
        var lattice = model.Lattice;
        if (lattice.Dimension < 2) throw new ArgumentException("Berry curvature needs a lattice with momentum.");
        if (n1 < 1 || n2 < 1) throw new ArgumentOutOfRangeException(nameof(n1), "grid divisions must be positive");
        if (lattice.Dimension == 2 && (origin.Z != 0 || span1.Z != 0 || span2.Z != 0))
            throw new ArgumentException("A plane of a 2D lattice must have zero third reduced components.");
        Vec3 c1 = lattice.Cartesian(span1.X, span1.Y, span1.Z), c2 = lattice.Cartesian(span2.X, span2.Y, span2.Z);
        var normal = c1.Cross(c2);
        if (!(normal.Norm > 1e-10 * Math.Max(c1.Norm * c2.Norm, 1e-300)))
            throw new ArgumentException("The plane's spanning vectors are parallel or zero: it does not cut the zone.");
        bool torus = IsInteger(span1) && IsInteger(span2);
        if (occupied < 1 || occupied >= source.Size) throw new ArgumentOutOfRangeException(nameof(occupied));

        int n = source.Size, block = n * occupied, rows = n1 + 1, cols = n2 + 1;
        var vecs = new Complex[rows * cols * block];
        Vec3 K(int i, int j) => lattice.Cartesian(origin.X + span1.X * i / n1 + span2.X * j / n2,
            origin.Y + span1.Y * i / n1 + span2.Y * j / n2, origin.Z + span1.Z * i / n1 + span2.Z * j / n2);
        Parallel.For(0, rows, () => new BlochWorkspace(source), (i, _, ws) =>
        {
            if (torus && i == n1) return ws;
            for (int j = 0; j < (torus ? n2 : cols); j++)
            {
                ws.Solve(K(i, j), true);
                var dst = vecs.AsSpan((i * cols + j) * block, block);
                for (int a = 0; a < n; a++)
                    for (int m = 0; m < occupied; m++) dst[a * occupied + m] = ws.Vectors[a * n + m];
            }
            return ws;
        }, _ => { });
        if (torus) CloseTorus(model, vecs, n, occupied, n1, n2, c1, c2);

        var omega = new double[n1, n2];
        var flux = new double[n1, n2];
        var centreR = new Vec3[n1, n2];
        var centreC = new Vec3[n1, n2];
        var work = new Complex[occupied * occupied];
        double area = normal.Norm / (n1 * n2), total = 0;
        ReadOnlySpan<Complex> V(int i, int j) => vecs.AsSpan((i * cols + j) * block, block);
        for (int i = 0; i < n1; i++)
            for (int j = 0; j < n2; j++)
            {
                double f = LinkVariable.PlaquetteFlux(
                    LinkVariable.Overlap(V(i, j), V(i + 1, j), n, occupied, occupied, work),
                    LinkVariable.Overlap(V(i + 1, j), V(i + 1, j + 1), n, occupied, occupied, work),
                    LinkVariable.Overlap(V(i + 1, j + 1), V(i, j + 1), n, occupied, occupied, work),
                    LinkVariable.Overlap(V(i, j + 1), V(i, j), n, occupied, occupied, work));
                flux[i, j] = f; omega[i, j] = f / area; total += f;
                centreR[i, j] = origin + ((i + 0.5) / n1) * span1 + ((j + 0.5) / n2) * span2;
                centreC[i, j] = lattice.Cartesian(centreR[i, j].X, centreR[i, j].Y, centreR[i, j].Z);
            }
        return new BerryCurvatureMap(origin, span1, span2, normal / normal.Norm, n1, n2, centreR, centreC, omega, flux,
                                     total / (2 * Math.PI), torus, occupied);
    }

    private static bool IsInteger(Vec3 v) =>
        Math.Abs(v.X - Math.Round(v.X)) < 1e-12 && Math.Abs(v.Y - Math.Round(v.Y)) < 1e-12 && Math.Abs(v.Z - Math.Round(v.Z)) < 1e-12;

    // Last row / column are the first ones shifted by a reciprocal lattice vector: copy them with the phase the site positions
    // give, u_a(k + G) = exp(-i G.tau_a) u_a(k).
    private static void CloseTorus(Binding.BoundModel model, Complex[] vecs, int n, int occ, int n1, int n2, Vec3 g1, Vec3 g2)
    {
        int cols = n2 + 1, block = n * occ, f = model.Flavours;
        void Copy(int fromI, int fromJ, int toI, int toJ, Vec3 g)
        {
            for (int a = 0; a < n; a++)
            {
                var tau = model.Sites[model.Orbitals[a / f].Site].Position;
                var phase = Complex.FromPolarCoordinates(1, -g.Dot(tau));
                for (int m = 0; m < occ; m++)
                    vecs[(toI * cols + toJ) * block + a * occ + m] = phase * vecs[(fromI * cols + fromJ) * block + a * occ + m];
            }
        }
        for (int j = 0; j < n2; j++) Copy(0, j, n1, j, g1);
        for (int i = 0; i < n1; i++) Copy(i, 0, i, n2, g2);
        Copy(0, 0, n1, n2, g1 + g2);
    }
}
