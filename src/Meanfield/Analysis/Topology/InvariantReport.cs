using Meanfield.Analysis.Symmetry;
using Meanfield.Bloch;

namespace Meanfield.Analysis.Topology;

/// <summary>
/// Every invariant that applies to the lowest <see cref="Occupied"/> bands: Z2 with time reversal (2D and 3D), the
/// Chern number in 2D without it.
/// </summary>
/// <param name="Occupied">Number of filled bands.</param>
/// <param name="Dimension">2 or 3.</param>
/// <param name="Z2">The Z2 result (status NotApplicable without spin-1/2 time reversal).</param>
/// <param name="Chern">The 2D Chern number when time reversal is broken; null otherwise (it vanishes with time reversal).</param>
public sealed record InvariantReport(int Occupied, int Dimension, Z2Result Z2, ChernResult? Chern)
{
    /// <summary>
    /// The overall state: the applicable invariant's status (Gapless whenever any calculation found no gap).
    /// </summary>
    public InvariantStatus Status =>
        Z2.Status == InvariantStatus.Gapless || Chern?.Status == InvariantStatus.Gapless ? InvariantStatus.Gapless
        : Chern is not null ? Chern.Status
        : Z2.Status;

    /// <summary>Computes the report (one gap check per invariant computed).</summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Size-1.</exception>
    public static InvariantReport Compute(IBlochSource source, int occupied, Z2Options? options = null)
    {
        var opt = options ?? new Z2Options();
        var z2 = Z2Invariants.Compute(source, occupied, opt);
        int dim = source.Model.Lattice.Dimension;
        ChernResult? chern = null;
        if (dim == 2 && !ModelSymmetry.HasTimeReversal(source))
            chern = ChernInvariant.Compute(source, occupied, 2 * opt.LoopPoints, opt.GapMesh, opt.AllowBandOverlap);
        return new InvariantReport(occupied, dim, z2, chern);
    }
}
