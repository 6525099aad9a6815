using Meanfield.Analysis.Nodes;

namespace Meanfield.Analysis.Responses;

/// <summary>
/// The Berry curvature dipole of the linear cones alone (3D, dimensionless): what the zone integral tends to when
/// k_B T and every |E_node - mu| are far inside the range where the cones are linear.
/// </summary>
/// <param name="Tensor">D_ab row-major (a = derivative direction, b = curvature component).</param>
/// <param name="Cones">Type-I Weyl cones summed.</param>
/// <param name="Skipped">Nodes left out, with why (Dirac nodes carry no monopole; type-II cones have open Fermi surfaces
/// for which the limit is not scale free; undetermined chiralities; cones that are flat in some direction).</param>
/// <param name="Complete">Every node entered the sum: only then is <see cref="Tensor"/> the cone limit of the whole D.</param>
public sealed record ConeDipoleResult(double[] Tensor, int Cones, IReadOnlyList<string> Skipped, bool Complete);

/// <summary>
/// D_ab of type-I Weyl cones E = w.k +- |V k| (V = <see cref="WeylNode.Velocity"/>, w = <see cref="WeylNode.Tilt"/>),
/// from the Fermi-surface form of Sodemann &amp; Fu (PRL 115, 216806 (2015), Eq. 3). Substituting q = V k, each cone
/// gives, whatever mu (within the linear range) and T,
/// D = -chi / (16 pi^3) V I(t) V^-1, with t = V^-1 w and
/// I_ab(t) = Int dOmega k_b (t_a + k_a) / (1 + t.k) = I_perp delta_ab + (I_par - I_perp) t_a t_b / t^2,
/// I_perp = pi [L - (L - 2) / t^2], I_par = 4 pi - 2 I_perp, L = ln((1 + t) / (1 - t)) / t (derived; both bands give
/// the same value). Its trace is -chi / (4 pi^2) for every tilt: the quantized Fermi-surface Berry flux of one node
/// (de Juan, Grushin, Morimoto &amp; Moore, Nat. Commun. 8, 15995 (2017)).
/// </summary>
public static class ConeDipole
{
    /// <summary>
    /// Below this tilt ratio I_perp is taken from its series pi (4/3 + 4 t^2/15 + 4 t^4/35 + 4 t^6/63) (truncation below
    /// 1e-17), where the closed form would lose digits to the cancellation in (L - 2) / t^2.
    /// </summary>
    public const double SeriesTilt = 1e-2;

    /// <summary>
    /// The cone limit of a 3D solution at a whole filling, from the nodes of its spectrum digest; null where it does not
    /// apply (2D, no k-space, a partly filled band, or no node at all).
    /// </summary>
    public static ConeDipoleResult? ForSolution(Solutions.Solution solution)
    {
        if (solution.Model.IsMomentumFree || solution.Model.Lattice.Dimension != 3 || !solution.WholeFilling || solution.Decoupled) return null;
        var digest = SpectrumSummary.Compute(solution, new SpectrumRequest { Dos = false, Heat = false, Topology = false });
        return digest.Nodes is { Nodes.Count: > 0 } nodes ? FromNodes(nodes) : null;
    }

    /// <summary>The cone limit summed over the nodes of a 3D node search.</summary>
    /// <exception cref="ArgumentException">A search of a 2D lattice (D has other units there and no monopoles).</exception>
    public static ConeDipoleResult FromNodes(NodeSearchResult search)
    {
        if (search.Dimension != 3) throw new ArgumentException("the cone limit of the curvature dipole is defined for 3D lattices only");
        var d = new double[9];
        var skipped = new List<string>();
        int cones = 0;
        foreach (var n in search.Nodes)
        {
            if (n.IsDirac) { skipped.Add($"Dirac node at {n.Reduced}: no monopole charge"); continue; }
            if (n.Chirality is not { } chi) { skipped.Add($"node at {n.Reduced}: chirality undetermined"); continue; }
            if (n.Type == NodeType.TypeII) { skipped.Add($"type-II node at {n.Reduced}: open Fermi surface, no scale-free limit"); continue; }
            if (!(n.DetVelocity > 0)) { skipped.Add($"node at {n.Reduced}: the cone is not linear in every direction"); continue; }
            Accumulate(d, chi, n.Velocity, n.Tilt);
            cones++;
        }
        return new ConeDipoleResult(d, cones, skipped, skipped.Count == 0);
    }

    /// <summary>Adds one cone's D = -chi/(16 pi^3) V I(V^-1 w) V^-1 to <paramref name="d"/> (row-major 3 x 3).</summary>
    /// <exception cref="ArgumentException">A singular V or a tilt ratio of 1 or more (type II).</exception>
    public static void Accumulate(double[] d, int chirality, double[,] velocity, Lattices.Vec3 tilt)
    {
        var vinv = Invert(velocity);
        double[] t = new double[3];
        for (int a = 0; a < 3; a++) t[a] = vinv[a, 0] * tilt.X + vinv[a, 1] * tilt.Y + vinv[a, 2] * tilt.Z;
        double tn = Math.Sqrt(t[0] * t[0] + t[1] * t[1] + t[2] * t[2]);
        if (tn >= 1) throw new ArgumentException($"tilt ratio {tn:G4}: the cone limit needs a type-I cone (ratio below 1)");
        var (perp, par) = Integrals(tn);
        var i = new double[3, 3];
        for (int a = 0; a < 3; a++)
            for (int b = 0; b < 3; b++)
                i[a, b] = (a == b ? perp : 0) + (tn > 0 ? (par - perp) * t[a] * t[b] / (tn * tn) : 0);
        double pre = -chirality / (16 * Math.PI * Math.PI * Math.PI);
        for (int a = 0; a < 3; a++)
            for (int b = 0; b < 3; b++)
            {
                double s = 0;
                for (int c = 0; c < 3; c++)
                    for (int e = 0; e < 3; e++) s += velocity[a, c] * i[c, e] * vinv[e, b];
                d[3 * a + b] += pre * s;
            }
    }

    /// <summary>(I_perp, I_par) of a cone of tilt ratio <paramref name="t"/> in [0, 1).</summary>
    public static (double Perp, double Par) Integrals(double t)
    {
        double perp = t < SeriesTilt
            ? Math.PI * (4.0 / 3 + t * t * (4.0 / 15 + t * t * (4.0 / 35 + t * t * 4.0 / 63)))
            : Math.PI * (Math.Log((1 + t) / (1 - t)) / t - (Math.Log((1 + t) / (1 - t)) / t - 2) / (t * t));
        return (perp, 4 * Math.PI - 2 * perp);
    }

    private static double[,] Invert(double[,] m)
    {
        Span<double> a = stackalloc double[9], inv = stackalloc double[9];
        for (int i = 0; i < 9; i++) a[i] = m[i / 3, i % 3];
        if (!Numerics.Matrix3.TryInvert(a, inv)) throw new ArgumentException("a cone with a singular velocity tensor has no linear limit");
        var r = new double[3, 3];
        for (int i = 0; i < 9; i++) r[i / 3, i % 3] = inv[i];
        return r;
    }
}
