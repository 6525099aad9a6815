using Meanfield.Analysis.Curvature;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Topology;

/// <summary>
/// Chern number of the lowest <see cref="Occupied"/> bands of a 2D model.
/// </summary>
/// <param name="Status">Determined, gapless, or unresolved (a plaquette flux too large even on the finest grid).</param>
/// <param name="Reason">One plain sentence explaining the status.</param>
/// <param name="Occupied">Number of bands whose Chern number is asked for.</param>
/// <param name="Chern">The Chern number when determined, else null.</param>
/// <param name="FluxOver2Pi">Total Berry flux over 2 pi on the last grid (an integer up to round-off).</param>
/// <param name="Grid">Plaquettes per reciprocal axis of the last grid.</param>
/// <param name="LargestPlaquetteFlux">Largest |flux| through one plaquette (radians) on the last grid.</param>
/// <param name="Gap">The gap check.</param>
public sealed record ChernResult(InvariantStatus Status, string Reason, int Occupied, int? Chern, double FluxOver2Pi, int Grid,
                                 double LargestPlaquetteFlux, GapCheckResult? Gap);

/// <summary>
/// C = (1 / 2 pi) sum over plaquettes of the link-variable flux of the occupied bands over the whole 2D zone
/// (Fukui, Hatsugai &amp; Suzuki, J. Phys. Soc. Jpn. 74, 1674 (2005), Eq. 8). The sum is an integer for any grid; it is
/// the Chern number once every plaquette flux is well inside (-pi, pi] (their admissibility condition), which is
/// checked against <see cref="AdmissibleFlux"/>, doubling the grid up to three times.
/// </summary>
public static class ChernInvariant
{
    /// <summary>Largest plaquette flux (radians) accepted: well inside pi, so no plaquette's flux is folded by 2 pi.</summary>
    public const double AdmissibleFlux = 1.0;

    /// <summary>
    /// The Chern number of the lowest <paramref name="occupied"/> bands; gapless spectra get
    /// <see cref="InvariantStatus.Gapless"/> and no number.
    /// </summary>
    /// <exception cref="ArgumentException">The lattice is not two-dimensional.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Size-1, or a grid below 4.</exception>
    public static ChernResult Compute(IBlochSource source, int occupied, int grid = 32, int gapMesh = 12, bool allowBandOverlap = false)
    {
        var model = source.Model;
        if (model.Lattice.Dimension != 2) throw new ArgumentException($"{model.Name}: the Chern number of the whole zone needs a 2D lattice.");
        if (occupied < 1 || occupied >= source.Size) throw new ArgumentOutOfRangeException(nameof(occupied));
        if (grid < 4) throw new ArgumentOutOfRangeException(nameof(grid), "at least 4 plaquettes per axis");
        var gap = GapCheckResult.Run(source, occupied, gapMesh);
        if (!gap.HasDirectGap)
            return new(InvariantStatus.Gapless, $"bands {occupied - 1} and {occupied} touch at {gap.Nodes} point(s)", occupied, null, double.NaN, grid, double.NaN, gap);
        if (gap.IndirectGap <= 0 && !allowBandOverlap)
            return new(InvariantStatus.Gapless, $"bands {occupied - 1} and {occupied} overlap in energy: no gap at this filling", occupied, null, double.NaN, grid, double.NaN, gap);
        BerryCurvatureMap map = null!;
        double largest = double.PositiveInfinity;
        for (int attempt = 0; attempt < 4; attempt++, grid *= 2)
        {
            map = BerryCurvature.Compute(source, Vec3.Zero, new Vec3(1, 0, 0), new Vec3(0, 1, 0), grid, grid, occupied);
            largest = 0;
            foreach (var f in map.Flux) largest = Math.Max(largest, Math.Abs(f));
            if (largest <= AdmissibleFlux) break;
        }
        if (largest > AdmissibleFlux)
            return new(InvariantStatus.Unresolved, $"a plaquette carries {largest:G3} rad even on a {map.N1}x{map.N2} grid", occupied, null,
                       map.TotalFluxOver2Pi, map.N1, largest, gap);
        return new(InvariantStatus.Determined, "link variables over the whole zone", occupied, map.ChernNumber, map.TotalFluxOver2Pi, map.N1, largest, gap);
    }
}
