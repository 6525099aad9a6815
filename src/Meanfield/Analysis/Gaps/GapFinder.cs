using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Gaps;

/// <summary>Direct and indirect gaps of a Bloch source on a mesh (extrema located on mesh points).</summary>
public static class GapFinder
{
    public static GapReport Find(IBlochSource source, KMesh mesh, int occupied)
    {
        if (occupied < 1 || occupied >= source.Size)
            throw new ArgumentOutOfRangeException(nameof(occupied), $"occupied band count {occupied} must lie in 1..{source.Size - 1}");
        return Find(MeshSpectrum.Compute(source, mesh, withProjections: false), occupied);
    }

    public static GapReport Find(MeshSpectrum sp, int occupied)
    {
        if (occupied < 1 || occupied >= sp.Bands) throw new ArgumentOutOfRangeException(nameof(occupied));
        int kd = 0, kv = 0, kc = 0;
        double direct = double.PositiveInfinity, vmax = double.NegativeInfinity, cmin = double.PositiveInfinity;
        for (int k = 0; k < sp.Mesh.Count; k++)
        {
            double v = sp.Energy(k, occupied - 1), c = sp.Energy(k, occupied);
            if (c - v < direct) { direct = c - v; kd = k; }
            if (v > vmax) { vmax = v; kv = k; }
            if (c < cmin) { cmin = c; kc = k; }
        }
        return new GapReport(direct, sp.Mesh.Cartesian(kd), cmin - vmax, vmax, sp.Mesh.Cartesian(kv), cmin, sp.Mesh.Cartesian(kc),
                             occupied, sp.Mesh.ToString());
    }
}
