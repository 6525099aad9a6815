using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// The energy scale of the bands next to the Fermi level: the largest width (max - min over a coarse mesh) of the bands
/// whose range contains mu, or, when mu lies in a gap, of the last band below and the first band above it. In the Kondo
/// regime these are the heavy bands, about z = r^2 times narrower than the conduction band (often 1e-3 of the total
/// bandwidth), so broadenings and windows are set relative to this scale, never to the total bandwidth (common practice).
/// </summary>
public static class LowEnergyScale
{
    /// <summary>Coarse mesh divisions used to measure band widths.</summary>
    public const int Mesh = 8;
    /// <summary>Default broadening eta as a fraction of the scale.</summary>
    public const double DefaultEtaFraction = 0.01;
    /// <summary>Fallback fraction of the total bandwidth when the bands next to mu are flat.</summary>
    public const double FlatBandFallback = 1e-3;

    /// <summary>The scale (energy unit) for chemical potential <paramref name="mu"/>.</summary>
    public static double Width(IBlochSource source, double mu)
    {
        var sp = MeshSpectrum.Compute(source, new KMesh(source.Model.Lattice, Mesh), withProjections: false);
        int bands = sp.Bands, nk = sp.Mesh.Count;
        var lo = new double[bands]; var hi = new double[bands];
        Array.Fill(lo, double.PositiveInfinity); Array.Fill(hi, double.NegativeInfinity);
        for (int k = 0; k < nk; k++)
            for (int n = 0; n < bands; n++) { double e = sp.Energy(k, n); lo[n] = Math.Min(lo[n], e); hi[n] = Math.Max(hi[n], e); }
        double width = 0;
        for (int n = 0; n < bands; n++) if (lo[n] <= mu && mu <= hi[n]) width = Math.Max(width, hi[n] - lo[n]);
        if (width == 0)
        {
            int below = -1;
            for (int n = 0; n < bands; n++) if (hi[n] < mu) below = n;
            if (below >= 0) width = hi[below] - lo[below];
            if (below + 1 < bands) width = Math.Max(width, hi[below + 1] - lo[below + 1]);
        }
        double total = hi.Max() - lo.Min();
        return width > FlatBandFallback * total ? width : Math.Max(FlatBandFallback * total, 1e-300);
    }
}
