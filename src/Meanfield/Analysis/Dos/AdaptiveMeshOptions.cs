namespace Meanfield.Analysis.Dos;

/// <summary>
/// How <see cref="AdaptiveTetrahedronDos"/> refines its mesh. A cell is split into eight while, for some band whose
/// energies in the cell come within <see cref="Window"/> of <see cref="ReferenceEnergy"/>, the error of linear
/// interpolation in the cell exceeds max(<see cref="RelativeTolerance"/> x d, <see cref="FloorTolerance"/> x
/// <see cref="Floor"/>, <see cref="LinearityTolerance"/> x s), d being the distance of the cell's energies from the
/// reference and s their spread over the cell. Energies in the model's unit.
/// </summary>
/// <remarks>
/// The linear tetrahedron DOS is exact for bands that are linear inside each tetrahedron, so its error at energy E is
/// set by the interpolation error of the tetrahedra holding states at E, relative to the scale on which the DOS varies
/// there. Near a band touching at the reference energy that scale is |E - E_ref| itself (rho ~ E^2), hence the relative
/// tolerance; below <see cref="Floor"/> (of order the lowest k_B T that will be asked) finer detail no longer matters.
/// A band that crosses the reference linearly (a Fermi surface) has a DOS that is smooth on the scale of its own
/// curvature, whatever T: a cell that is linear to a small fraction of its own energy spread needs no splitting even at
/// d = 0. Kinks (nodes) and extrema (band edges, pockets) are not linear on that scale and are still refined.
/// </remarks>
public sealed record AdaptiveMeshOptions
{
    /// <summary>Gamma-centred base mesh divisions per reciprocal axis (at least 2; default 24).</summary>
    public int BaseMesh { get; init; } = 24;

    /// <summary>The energy the refinement is centred on (energy unit), usually the Fermi level.</summary>
    public required double ReferenceEnergy { get; init; }

    /// <summary>Cells whose energies all lie farther than this from the reference are never refined (energy unit, positive).</summary>
    public required double Window { get; init; }

    /// <summary>Energy below which detail is not resolved further (energy unit, positive), e.g. the lowest k_B T.</summary>
    public required double Floor { get; init; }

    /// <summary>Allowed interpolation error as a fraction of the distance from the reference energy (default 0.02).</summary>
    public double RelativeTolerance { get; init; } = 0.02;

    /// <summary>Allowed interpolation error as a fraction of <see cref="Floor"/> (default 0.1).</summary>
    public double FloorTolerance { get; init; } = 0.1;

    /// <summary>A cell whose interpolation error is at most this fraction of its energy spread counts as linear
    /// (default 0.01).</summary>
    public double LinearityTolerance { get; init; } = 0.01;

    /// <summary>Most cells the refinement may create (default 4,000,000); beyond it the worst cells are refined first and
    /// <see cref="AdaptiveTetrahedronDos.BudgetExhausted"/> says so.</summary>
    public int MaxCells { get; init; } = 4_000_000;

    /// <summary>Throws <see cref="ArgumentException"/> naming the first option out of range.</summary>
    public void Validate()
    {
        if (BaseMesh < 2) throw new ArgumentException($"base mesh {BaseMesh}: need at least 2 divisions");
        if (!double.IsFinite(ReferenceEnergy)) throw new ArgumentException("the reference energy must be finite");
        if (!(Window > 0) || !double.IsFinite(Window)) throw new ArgumentException($"window {Window}: must be positive");
        if (!(Floor > 0) || !double.IsFinite(Floor)) throw new ArgumentException($"floor {Floor}: must be positive");
        if (!(RelativeTolerance > 0 && RelativeTolerance < 1)) throw new ArgumentException($"relative tolerance {RelativeTolerance}: need 0 < value < 1");
        if (!(FloorTolerance > 0)) throw new ArgumentException($"floor tolerance {FloorTolerance}: must be positive");
        if (!(LinearityTolerance >= 0 && LinearityTolerance < 1)) throw new ArgumentException($"linearity tolerance {LinearityTolerance}: need 0 <= value < 1");
        if (MaxCells < 1) throw new ArgumentException($"cell budget {MaxCells}: must be positive");
    }
}
