using System.Numerics;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Symmetry;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Topology;

/// <summary>
/// Parities of the occupied bands at one time-reversal-invariant momentum Gamma_i = (n1 b1 + n2 b2 + n3 b3) / 2.
/// </summary>
/// <param name="Index">(n1, n2, n3), each 0 or 1 (n3 = 0 in 2D).</param>
/// <param name="Reduced">Reduced coordinates n / 2.</param>
/// <param name="OddStates">Occupied states of parity -1 (an even number when Kramers pairs share a parity).</param>
/// <param name="Delta">delta_i = product of one parity per Kramers pair = (-1)^(OddStates / 2).</param>
/// <param name="Gap">E_{n_occ} - E_{n_occ - 1} at the TRIM (energy unit).</param>
/// <param name="Resolved">The parity count was an even integer (the occupied subspace is invariant and Kramers paired).</param>
public sealed record TrimParity((int N1, int N2, int N3) Index, Vec3 Reduced, int OddStates, int Delta, double Gap, bool Resolved);

/// <summary>
/// The Fu-Kane parity formula for inversion-symmetric, time-reversal-invariant insulators (Fu &amp; Kane, PRB 76,
/// 045302 (2007), Eqs. 3.10-3.12): delta_i = prod_m xi_2m(Gamma_i) over the occupied Kramers pairs,
/// (-1)^nu0 = prod_i delta_i over the eight TRIM, (-1)^nu_k = prod over the four TRIM with n_k = 1; in 2D
/// (-1)^nu = prod over the four TRIM.
/// </summary>
/// <remarks>
/// The inversion {-1|t} maps orbital o at tau_o to P(o) at t - tau_o. With Bloch phases that include
/// the site positions, e^{ik.(R + tau_j - tau_i)}, the Bloch state |k, o&gt; goes to e^{ik.t} chi_o |-k, P(o)&gt;, and at a TRIM
/// -Gamma = Gamma - G with |Gamma - G, o'&gt; = e^{-iG.tau_o'} |Gamma, o'&gt;. The parity operator acting on H(Gamma) is
/// therefore (P_Gamma)[P(o), o] = chi_o exp(i Gamma.t - i G.tau_P(o)) with G = 2 Gamma: the site-position phase and
/// the centre phase e^{iG.c} (c = t / 2) both matter, and together they make P_Gamma^2 = 1.
/// </remarks>
public static class ParityInvariants
{
    /// <summary>
    /// Parities at the 2^d TRIM of the lowest <paramref name="occupied"/> bands.
    /// </summary>
    /// <exception cref="ArgumentException">The operation is not the inversion.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Size-1.</exception>
    public static IReadOnlyList<TrimParity> AtTrim(IBlochSource source, SpaceOperation inversion, int occupied)
    {
        if (!inversion.IsInversion) throw new ArgumentException("The operation is not the inversion.", nameof(inversion));
        if (occupied < 1 || occupied >= source.Size) throw new ArgumentOutOfRangeException(nameof(occupied));
        var model = source.Model;
        var lattice = model.Lattice;
        int n = source.Size, f = model.Flavours, d3 = lattice.Dimension == 3 ? 1 : 0;
        var ws = new BlochWorkspace(source);
        var result = new List<TrimParity>();
        for (int n1 = 0; n1 <= 1; n1++)
            for (int n2 = 0; n2 <= 1; n2++)
                for (int n3 = 0; n3 <= d3; n3++)
                {
                    var g = lattice.Cartesian(n1, n2, n3);
                    var gamma = g / 2;
                    ws.Solve(gamma, true);
                    double trace = 0;
                    for (int o = 0; o < model.Orbitals.Count; o++)
                    {
                        int p = inversion.OrbitalImage[o];
                        var tauP = model.Sites[model.Orbitals[p].Site].Position;
                        var phase = inversion.Character[o] * Complex.FromPolarCoordinates(1, gamma.Dot(inversion.Translation) - g.Dot(tauP));
                        for (int a = 0; a < f; a++)
                            for (int m = 0; m < occupied; m++)
                                trace += (Complex.Conjugate(ws.Vectors[(p * f + a) * n + m]) * phase * ws.Vectors[(o * f + a) * n + m]).Real;
                    }
                    double odd = (occupied - trace) / 2;
                    int oddInt = (int)Math.Round(odd);
                    bool resolved = Math.Abs(odd - oddInt) < TopologyTolerances.ParityCount && oddInt % 2 == 0;
                    result.Add(new((n1, n2, n3), new Vec3(n1 / 2.0, n2 / 2.0, n3 / 2.0), oddInt,
                        (oddInt / 2) % 2 == 0 ? 1 : -1, ws.Values[occupied] - ws.Values[occupied - 1], resolved));
                }
        return result;
    }

    /// <summary>
    /// The Z2 indices from the TRIM parities: 3D (nu0; nu1 nu2 nu3) with the weak indices in the basis b1, b2, b3,
    /// or the single 2D index (as nu0, with no weak indices).
    /// </summary>
    public static Z2Indices Indices(IReadOnlyList<TrimParity> trims, int dimension)
    {
        int Product(Func<TrimParity, bool> which) => trims.Where(which).Aggregate(1, (p, t) => p * t.Delta);
        int nu0 = Product(_ => true) == 1 ? 0 : 1;
        if (dimension == 2) return new Z2Indices(2, nu0, []);
        return new Z2Indices(3, nu0,
        [
            Product(t => t.Index.N1 == 1) == 1 ? 0 : 1,
            Product(t => t.Index.N2 == 1) == 1 ? 0 : 1,
            Product(t => t.Index.N3 == 1) == 1 ? 0 : 1,
        ]);
    }
}
