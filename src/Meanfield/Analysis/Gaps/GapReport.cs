using Meanfield.Lattices;

namespace Meanfield.Analysis.Gaps;

/// <summary>
/// Gaps between the highest occupied band n_occ - 1 and the lowest empty band n_occ on a k-mesh (energy unit).
/// Direct: min_k [E_{n_occ}(k) - E_{n_occ-1}(k)]. Indirect: min_k E_{n_occ} - max_k E_{n_occ-1}; negative when the
/// bands overlap in energy (a metal or semimetal). Wave vectors are Cartesian (inverse angstrom).
/// </summary>
public sealed record GapReport(
    double Direct, Vec3 DirectAt,
    double Indirect, double ValenceMaximum, Vec3 ValenceMaximumAt, double ConductionMinimum, Vec3 ConductionMinimumAt,
    int OccupiedBands, string Mesh)
{
    /// <summary>True when the indirect gap exceeds <paramref name="tolerance"/>: the spectrum is separated.</summary>
    public bool IsGapped(double tolerance) => Indirect > tolerance;
}
