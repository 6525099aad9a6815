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

    /// <summary>
    /// The gaps of a pass over a wedge: band extrema are the same across an orbit, and representatives are the smallest
    /// full-mesh index of their orbit and ascend, so the first extremum met is the one a scan of the full mesh meets.
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Bands-1.</exception>
    public static GapReport Find(Solver.ZonePass pass, int occupied)
    {
        if (occupied < 1 || occupied >= pass.Bands) throw new ArgumentOutOfRangeException(nameof(occupied));
        int kd = 0, kv = 0, kc = 0, n = pass.Bands;
        double direct = double.PositiveInfinity, vmax = double.NegativeInfinity, cmin = double.PositiveInfinity;
        var reps = pass.Wedge.Representatives;
        for (int w = 0; w < pass.Wedge.Count; w++)
        {
            double v = pass.Energies[w * n + occupied - 1], c = pass.Energies[w * n + occupied];
            if (c - v < direct) { direct = c - v; kd = reps[w]; }
            if (v > vmax) { vmax = v; kv = reps[w]; }
            if (c < cmin) { cmin = c; kc = reps[w]; }
        }
        var mesh = pass.Wedge.Mesh;
        return new GapReport(direct, mesh.Cartesian(kd), cmin - vmax, vmax, mesh.Cartesian(kv), cmin, mesh.Cartesian(kc), occupied, mesh.ToString());
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
