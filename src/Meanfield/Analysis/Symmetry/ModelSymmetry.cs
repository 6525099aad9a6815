using System.Numerics;
using Meanfield.Analysis.Topology;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Symmetry;

/// <summary>
/// Finds the symmetries of a Bloch Hamiltonian numerically: the operations {g|t} of the lattice's point group
/// (holohedry) that map the sites onto themselves and satisfy H(g k) = U H(k) U^dag at a few pseudo-random k-points,
/// and time reversal. Orbitals are treated as one-dimensional objects with a character +-1 (s-like, or a pseudo-spin
/// doublet carried by the flavour index), so operations that would mix several orbitals of one site (p_x into p_y)
/// are not found: the group returned is then a subgroup of the true one, which can only widen the allowed tensors.
/// </summary>
public static class ModelSymmetry
{
    private const int Samples = 3;
    private const int Seed = 4711;

    /// <summary>
    /// Every space-group operation (one per rotation part g) that leaves H invariant; the identity comes first.
    /// </summary>
    /// <exception cref="ArgumentException">The lattice has no momentum (a DOS lattice).</exception>
    public static IReadOnlyList<SpaceOperation> Find(IBlochSource source)
    {
        var model = source.Model;
        if (model.Lattice.Dimension < 2) throw new ArgumentException("Symmetries need a lattice with momentum.");
        var ks = SampleK(model.Lattice);
        var hk = ks.Select(k => Assemble(source, k)).ToArray();
        double scale = hk.Max(h => h.Max(z => z.Magnitude));
        var found = new List<SpaceOperation>();
        foreach (var g in LatticeRotations(model.Lattice))
        {
            var op = Match(source, g, ks, hk, scale);
            if (op is not null) found.Add(op);
        }
        found.Sort((a, b) => IsIdentity(b.Rotation).CompareTo(IsIdentity(a.Rotation)));
        return found;
    }

    /// <summary>The inversion {-1|t} if it is a symmetry of H, else null.</summary>
    public static SpaceOperation? FindInversion(IBlochSource source)
    {
        var model = source.Model;
        if (model.Lattice.Dimension < 2) return null;
        var ks = SampleK(model.Lattice);
        var hk = ks.Select(k => Assemble(source, k)).ToArray();
        double scale = hk.Max(h => h.Max(z => z.Magnitude));
        return Match(source, [-1, 0, 0, 0, -1, 0, 0, 0, -1], ks, hk, scale);
    }

    /// <summary>
    /// Largest |H(-k) - T H(k)^* T^dag| over the sampled k, relative to the largest |H_ij|, for the spin-1/2 time
    /// reversal T = i sigma_y K (acting on the flavour index). Returns +infinity when flavours != 2 (no Kramers
    /// time reversal defined).
    /// </summary>
    public static double TimeReversalDefect(IBlochSource source)
    {
        var model = source.Model;
        if (model.Flavours != 2 || model.Lattice.Dimension < 2) return double.PositiveInfinity;
        int n = source.Size;
        double worst = 0, scale = 0;
        foreach (var k in SampleK(model.Lattice))
        {
            var h = Assemble(source, k);
            var hm = Assemble(source, -k);
            for (int i = 0; i < n; i++)
                for (int j = 0; j < n; j++)
                {
                    scale = Math.Max(scale, h[i * n + j].Magnitude);
                    // (T H^* T^dag)[o a, o' b] with T = i sigma_y: sign(a) sign(b) conj(H[o abar, o' bbar]), sign(0) = +1, sign(1) = -1.
                    int ia = i ^ 1, jb = j ^ 1;
                    double sign = ((i & 1) == (j & 1)) ? 1 : -1;
                    var t = sign * Complex.Conjugate(h[ia * n + jb]);
                    worst = Math.Max(worst, (hm[i * n + j] - t).Magnitude);
                }
        }
        return worst / Math.Max(scale, 1e-300);
    }

    /// <summary>True when the spin-1/2 time reversal is a symmetry within <see cref="TopologyTolerances.SymmetryDefect"/>.</summary>
    public static bool HasTimeReversal(IBlochSource source) => TimeReversalDefect(source) <= TopologyTolerances.SymmetryDefect;

    /// <summary>
    /// The orthogonal g (row-major, Cartesian) with g a_i = sum_j N_ij a_j for an integer N with entries in {-1, 0, 1}:
    /// the lattice's point group for the primitive cells meanfield builds.
    /// </summary>
    public static IEnumerable<double[]> LatticeRotations(Lattice lattice)
    {
        Vec3[] a = [lattice.A1, lattice.A2, lattice.A3], b = [lattice.B1, lattice.B2, lattice.B3];
        var n = new int[9];
        for (int code = 0; code < 19683; code++)
        {
            int c = code;
            for (int i = 0; i < 9; i++) { n[i] = c % 3 - 1; c /= 3; }
            // g = Acol N^T Acol^-1, Acol = [a1 a2 a3] as columns, Acol^-1 rows b_i / 2 pi.
            var g = new double[9];
            for (int r = 0; r < 3; r++)
                for (int s = 0; s < 3; s++)
                {
                    double v = 0;
                    for (int i = 0; i < 3; i++)
                        for (int j = 0; j < 3; j++)
                            v += a[j][r] * n[i * 3 + j] * b[i][s];
                    g[r * 3 + s] = v / (2 * Math.PI);
                }
            if (IsOrthogonal(g)) yield return g;
        }
    }

    private static bool IsOrthogonal(double[] g)
    {
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
            {
                double d = 0;
                for (int k = 0; k < 3; k++) d += g[i * 3 + k] * g[j * 3 + k];
                if (Math.Abs(d - (i == j ? 1 : 0)) > 1e-9) return false;
            }
        return true;
    }

    private static bool IsIdentity(double[] g)
    {
        for (int i = 0; i < 9; i++) if (Math.Abs(g[i] - (i % 4 == 0 ? 1 : 0)) > 1e-9) return false;
        return true;
    }

    private static Vec3[] SampleK(Lattice lattice)
    {
        var rng = new Random(Seed);
        var ks = new Vec3[Samples];
        for (int s = 0; s < Samples; s++)
            ks[s] = lattice.Cartesian(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, lattice.Dimension == 3 ? rng.NextDouble() - 0.5 : 0);
        return ks;
    }

    private static Complex[] Assemble(IBlochSource source, Vec3 k)
    {
        var h = new Complex[source.Size * source.Size];
        source.Assemble(k, h, new Complex[source.Size * source.Size]);
        return h;
    }

    // Tries every translation that carries site 0 onto a site; returns the first operation that leaves H invariant.
    private static SpaceOperation? Match(IBlochSource source, double[] g, Vec3[] ks, Complex[][] hk, double scale)
    {
        var model = source.Model;
        var gOp = new SpaceOperation(g, Vec3.Zero, [], [], []);
        var spin = SpinMatrix(g, gOp.Determinant, model.Flavours);
        var hg = ks.Select(k => Assemble(source, gOp.Apply(k))).ToArray();
        var hs = hk.Select(h => Conjugate(h, spin, source.Size, model.Flavours)).ToArray();
        foreach (var target in model.Sites)
        {
            var t = target.Position - gOp.Apply(model.Sites[0].Position);
            var image = OrbitalImage(model, g, t);
            if (image is null) continue;
            var character = Characters(model, image, hg, hs, scale);
            if (character is not null) return new SpaceOperation(g, t, image, character, spin);
        }
        return null;
    }

    private static int[]? OrbitalImage(BoundModel model, double[] g, Vec3 t)
    {
        var op = new SpaceOperation(g, t, [], [], []);
        var siteImage = new int[model.Sites.Count];
        for (int i = 0; i < model.Sites.Count; i++)
        {
            var y = op.Apply(model.Sites[i].Position) + t;
            siteImage[i] = -1;
            for (int j = 0; j < model.Sites.Count && siteImage[i] < 0; j++)
                if (model.Lattice.LatticeCoordinates(y - model.Sites[j].Position) is not null) siteImage[i] = j;
            if (siteImage[i] < 0) return null;
        }
        var image = new int[model.Orbitals.Count];
        for (int o = 0; o < image.Length; o++)
        {
            var orb = model.Orbitals[o];
            image[o] = -1;
            for (int p = 0; p < image.Length; p++)
            {
                var q = model.Orbitals[p];
                if (q.Site == siteImage[orb.Site] && q.Name == orb.Name && q.Kind == orb.Kind) { image[o] = p; break; }
            }
            if (image[o] < 0) return null;
        }
        return image.Distinct().Count() == image.Length ? image : null;
    }

    // Characters by propagation along coupled orbital pairs, then a full check of every block.
    private static int[]? Characters(BoundModel model, int[] image, Complex[][] hg, Complex[][] hs, double scale)
    {
        int no = model.Orbitals.Count, f = model.Flavours, n = no * f;
        double tol = TopologyTolerances.SymmetryDefect * Math.Max(scale, 1e-300);
        var chi = new int[no];
        Complex Overlap(int o, int p)
        {
            Complex s = 0;
            for (int m = 0; m < hg.Length; m++)
                for (int a = 0; a < f; a++)
                    for (int b = 0; b < f; b++)
                        s += Complex.Conjugate(hs[m][(o * f + a) * n + p * f + b]) * hg[m][(image[o] * f + a) * n + image[p] * f + b];
            return s;
        }
        for (int start = 0; start < no; start++)
        {
            if (chi[start] != 0) continue;
            chi[start] = 1;
            var queue = new Queue<int>([start]);
            while (queue.Count > 0)
            {
                int o = queue.Dequeue();
                for (int p = 0; p < no; p++)
                {
                    if (chi[p] != 0) continue;
                    var s = Overlap(o, p);
                    if (s.Magnitude <= tol * tol) continue;
                    chi[p] = chi[o] * (s.Real >= 0 ? 1 : -1);
                    queue.Enqueue(p);
                }
            }
        }
        for (int m = 0; m < hg.Length; m++)
            for (int o = 0; o < no; o++)
                for (int p = 0; p < no; p++)
                    for (int a = 0; a < f; a++)
                        for (int b = 0; b < f; b++)
                        {
                            var lhs = hg[m][(image[o] * f + a) * n + image[p] * f + b];
                            var rhs = chi[o] * chi[p] * hs[m][(o * f + a) * n + p * f + b];
                            if ((lhs - rhs).Magnitude > tol) return null;
                        }
        return chi;
    }

    // S H S^dag on the flavour index of every orbital block.
    private static Complex[] Conjugate(Complex[] h, Complex[] s, int n, int f)
    {
        var r = new Complex[n * n];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
            {
                int oi = i / f, a = i % f, oj = j / f, b = j % f;
                Complex v = 0;
                for (int c = 0; c < f; c++)
                    for (int d = 0; d < f; d++)
                        v += s[a * f + c] * h[(oi * f + c) * n + oj * f + d] * Complex.Conjugate(s[b * f + d]);
                r[i * n + j] = v;
            }
        return r;
    }

    /// <summary>
    /// The SU(2) matrix exp(-i theta n.sigma / 2) of the proper rotation det(g) g for spin-1/2 (either sign: only
    /// S H S^dag is used); the identity for other flavour counts, which carry no spin.
    /// </summary>
    public static Complex[] SpinMatrix(double[] g, double det, int flavours)
    {
        if (flavours != 2)
        {
            var id = new Complex[flavours * flavours];
            for (int a = 0; a < flavours; a++) id[a * flavours + a] = 1;
            return id;
        }
        var r = g.Select(x => det * x).ToArray();
        double tr = r[0] + r[4] + r[8];
        double cos = Math.Clamp((tr - 1) / 2, -1, 1), theta = Math.Acos(cos);
        Vec3 axis;
        var anti = new Vec3(r[7] - r[5], r[2] - r[6], r[3] - r[1]);
        if (anti.Norm > 1e-6) axis = anti / anti.Norm;
        else if (cos > 0) axis = new Vec3(0, 0, 1);                 // identity: any axis, theta = 0
        else
        {
            // theta = pi: R = 2 n n^T - 1, take the largest column of (R + 1) / 2.
            int best = r[0] >= r[4] && r[0] >= r[8] ? 0 : r[4] >= r[8] ? 1 : 2;
            var col = new Vec3((r[best] + (best == 0 ? 1 : 0)) / 2, (r[3 + best] + (best == 1 ? 1 : 0)) / 2, (r[6 + best] + (best == 2 ? 1 : 0)) / 2);
            axis = col / col.Norm;
        }
        double c = Math.Cos(theta / 2), s = Math.Sin(theta / 2);
        var i = Complex.ImaginaryOne;
        // c 1 - i s (nx sx + ny sy + nz sz)
        return [c - i * s * axis.Z, -i * s * axis.X - s * axis.Y, -i * s * axis.X + s * axis.Y, c + i * s * axis.Z];
    }
}
