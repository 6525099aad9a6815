using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Models;

/// <summary>
/// A model file as written: names, expressions and file positions, no numbers yet. <see cref="ModelBinder"/> turns it
/// into a <see cref="BoundModel"/> for a choice of parameter values.
/// </summary>
public sealed record ModelSpec
{
    public required string SourceName { get; init; }
    public required string SourceText { get; init; }
    public required ModelHeader Header { get; init; }
    /// <summary>Parameters in file order; each default may use the ones before it.</summary>
    public required IReadOnlyList<ParameterSpec> Parameters { get; init; }
    public required LatticeSpec Lattice { get; init; }
    public required IReadOnlyList<SiteSpec> Sites { get; init; }
    /// <summary>[[hopping]], [[hybridization]] and [[ff_hopping]] blocks in file order.</summary>
    public required IReadOnlyList<BondSpec> Bonds { get; init; }
    public required IReadOnlyList<OnsiteSpec> Onsite { get; init; }
    public required IReadOnlyList<StaggeredSpec> Staggered { get; init; }
    public ZeemanSpec? Zeeman { get; init; }
    public required IReadOnlyList<SpinOrbitDiamondSpec> SpinOrbit { get; init; }
    public SolverHints? Solver { get; init; }
}

/// <summary>The [model] table. Flavours: 2 for spin-1/2, N for SU(N), 1 spinless.</summary>
public sealed record ModelHeader(string Name, EnergyUnit Unit, ModelExpression FormulaUnitsPerCell,
                                 ModelExpression ElectronsPerCell, int Flavours, SourceLocation Location);

/// <summary>One entry of [parameters]: a default value, overridable from the command line.</summary>
public sealed record ParameterSpec(string Name, ModelExpression Value, SourceLocation Location);

/// <summary>The [lattice] table. Vectors (explicit kind only) are in units of the lattice constant.</summary>
public sealed record LatticeSpec(LatticeKind Kind, ModelExpression? Constant, IReadOnlyList<Vec3>? Vectors,
                                 ModelExpression? HalfWidth, SourceLocation Location);

/// <summary>A [[site]] block; Position in units of the lattice constant, null when the lattice supplies it.</summary>
public sealed record SiteSpec(string Name, Vec3? Position, IReadOnlyList<string> Orbitals, ShellSpec? Shell,
                              string Field, SourceLocation Location);

/// <summary>The [site.shell] sub-table: the correlated shell of the site; U null means infinite U.</summary>
public sealed record ShellSpec(string Name, ModelExpression Level, int? Degeneracy, ModelExpression Constraint,
                               string? Group, string Field, SourceLocation Location, ModelExpression? U = null);

/// <summary>"site:orbital" as written, with its place for messages.</summary>
public sealed record OrbitalRef(string Site, string Orbital, string Field, SourceLocation Location)
{
    public override string ToString() => $"{Site}:{Orbital}";
}

/// <summary>
/// A flavour matrix as written: either a scalar times the identity, or a Pauli decomposition
/// identity + x sigma_x + y sigma_y + z sigma_z with any subset of the four coefficients.
/// </summary>
public sealed record AmplitudeSpec(ModelExpression? Scalar, ModelExpression? Identity, ModelExpression? X,
                                   ModelExpression? Y, ModelExpression? Z, string Field, SourceLocation Location)
{
    public bool IsPauli => Scalar is null;
}

public enum BondKind { Hopping, Hybridization, FfHopping }

/// <summary>
/// A [[hopping]], [[hybridization]] or [[ff_hopping]] block: either one bond to the cell <see cref="Vector"/> or every
/// bond of the <see cref="Neighbour"/>-th distance shell.
/// </summary>
public sealed record BondSpec(BondKind Kind, OrbitalRef From, OrbitalRef To, (int N1, int N2, int N3)? Vector,
                              int? Neighbour, AmplitudeSpec Amplitude, string Field, SourceLocation Location);

public sealed record OnsiteSpec(OrbitalRef Orbital, AmplitudeSpec Energy, string Field, SourceLocation Location);

/// <summary>A sign per site for a staggered potential, as written.</summary>
public sealed record SiteSign(string Site, double Sign, SourceLocation Location);

/// <summary>A staggered potential sign_s * amplitude on orbital <see cref="Orbital"/> of every site carrying it.</summary>
public sealed record StaggeredSpec(string Orbital, ModelExpression Amplitude, IReadOnlyList<SiteSign>? Signs,
                                   string Field, SourceLocation Location);

public enum ZeemanTarget { All, Conduction, Correlated }

/// <summary>A Zeeman term B.sigma (B in the energy unit) on every orbital selected by <see cref="ActsOn"/>.</summary>
public sealed record ZeemanSpec(IReadOnlyList<ModelExpression> Field, ZeemanTarget ActsOn, SourceLocation Location);

/// <summary>The Fu-Kane-Mele next-nearest-neighbour spin-orbit term of strength lambda on one orbital of a diamond lattice.</summary>
public sealed record SpinOrbitDiamondSpec(string Orbital, ModelExpression Amplitude, string Field, SourceLocation Location);
