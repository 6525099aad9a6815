using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// The energy scale of the bands next to the Fermi level. The bands considered are those whose range contains mu or,
/// when mu lies in a gap, the last band below and the first band above it. With correlated orbitals the scale is the
/// energy spread of their heavy part (states with correlated weight at least <see cref="HeavyWeight"/>): a hybridized
/// band follows the conduction band far from E_F, but its heavy part near E_F is about z = r^2 times narrower (often
/// 1e-3 of the total bandwidth). Without correlated orbitals it is the width of those bands. Broadenings and windows
/// are set relative to this scale, never to the total bandwidth (common practice).
/// </summary>
public static class LowEnergyScale
{
    /// <summary>Coarse mesh divisions used to measure the spread.</summary>
    public const int Mesh = 8;
    /// <summary>Correlated-orbital weight from which a state counts as heavy.</summary>
    public const double HeavyWeight = 0.5;
    /// <summary>Default broadening eta as a fraction of the scale. For the shipped Weyl-Kondo model (scale about 65 meV)
    /// eta is about 0.026 meV: below its node offsets from mu (0.04 meV) and Kondo gap (0.7-1.3 meV), so Fermi arcs
    /// separate from the nearly flat heavy surface bands; 5 times more already paints whole regions of the zone.</summary>
    public const double DefaultEtaFraction = 4e-4;
    /// <summary>Fallback fraction of the total bandwidth when the bands next to mu are flat.</summary>
    public const double FlatBandFallback = 1e-3;

    /// <summary>The scale (energy unit) for chemical potential <paramref name="mu"/>.</summary>
    public static double Width(IBlochSource source, double mu)
    {
        bool correlated = source.Model.Shells.Count > 0;
        var sp = MeshSpectrum.Compute(source, new KMesh(source.Model.Lattice, Mesh), withProjections: correlated);
        int bands = sp.Bands, nk = sp.Mesh.Count;
        var lo = new double[bands]; var hi = new double[bands];
        var heavyLo = new double[bands]; var heavyHi = new double[bands];
        Array.Fill(lo, double.PositiveInfinity); Array.Fill(hi, double.NegativeInfinity);
        Array.Fill(heavyLo, double.PositiveInfinity); Array.Fill(heavyHi, double.NegativeInfinity);
        for (int k = 0; k < nk; k++)
            for (int n = 0; n < bands; n++)
            {
                double e = sp.Energy(k, n);
                lo[n] = Math.Min(lo[n], e); hi[n] = Math.Max(hi[n], e);
                if (correlated && sp.Weights[(k * bands + n) * sp.Channels + 1] >= HeavyWeight)
                { heavyLo[n] = Math.Min(heavyLo[n], e); heavyHi[n] = Math.Max(heavyHi[n], e); }
            }
        var next = new List<int>();
        for (int n = 0; n < bands; n++) if (lo[n] <= mu && mu <= hi[n]) next.Add(n);
        if (next.Count == 0)
        {
            int below = -1;
            for (int n = 0; n < bands; n++) if (hi[n] < mu) below = n;
            if (below >= 0) next.Add(below);
            if (below + 1 < bands) next.Add(below + 1);
        }
        double width = 0;
        foreach (int n in next)
            width = Math.Max(width, heavyHi[n] > heavyLo[n] ? heavyHi[n] - heavyLo[n] : hi[n] - lo[n]);
        double total = hi.Max() - lo.Min();
        return width > FlatBandFallback * total ? width : Math.Max(FlatBandFallback * total, 1e-300);
    }
}
