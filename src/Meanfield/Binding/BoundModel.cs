using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Binding;

/// <summary>
/// A lattice model with every parameter bound to a number: the input of the Bloch Hamiltonian and of the mean field.
/// Energies are in <see cref="Unit"/>; lengths in angstrom.
/// </summary>
public sealed class BoundModel
{
    public required string Name { get; init; }
    public required Lattice Lattice { get; init; }
    /// <summary>Flavour components per orbital: 2 for spin-1/2, N for an SU(N) model, 1 for spinless.</summary>
    public required int Flavours { get; init; }
    public required IReadOnlyList<Site> Sites { get; init; }
    public required IReadOnlyList<Orbital> Orbitals { get; init; }
    public required IReadOnlyList<CorrelatedShell> Shells { get; init; }
    public required IReadOnlyList<Hopping> Hoppings { get; init; }
    public required IReadOnlyList<OnsiteTerm> Onsite { get; init; }
    /// <summary>Electrons per unit cell, N_e (conduction plus correlated).</summary>
    public required double ElectronsPerCell { get; init; }
    public EnergyUnit Unit { get; init; } = EnergyUnit.MilliElectronVolt;
    public double FormulaUnitsPerCell { get; init; } = 1;
    /// <summary>Half-width D of the conduction DOS for the momentum-free lattices (energy unit); 0 otherwise.</summary>
    public double DosHalfWidth { get; init; }
    /// <summary>Parameter values used to bind the model, in file order.</summary>
    public IReadOnlyList<KeyValuePair<string, double>> Parameters { get; init; } = [];
    /// <summary>Full text of the model file (its hash goes into every output's provenance).</summary>
    public string SourceText { get; init; } = "";
    public string SourcePath { get; init; } = "";
    /// <summary>Solver settings suggested by the model file's [solver] table, or null.</summary>
    public SolverHints? Solver { get; init; }

    /// <summary>Dimension of the Bloch Hamiltonian: orbitals times flavours.</summary>
    public int BasisSize => Orbitals.Count * Flavours;

    public bool IsMomentumFree => Lattice.Kind.IsMomentumFree();

    /// <summary>Distinct shell groups in order of first appearance: each carries one (r, lambda) pair.</summary>
    public IReadOnlyList<string> ShellGroups()
    {
        var groups = new List<string>();
        foreach (var s in Shells) if (!groups.Contains(s.Group)) groups.Add(s.Group);
        return groups;
    }

    /// <summary>Total number of states per cell (basis size), the upper bound of the electron count.</summary>
    public int StatesPerCell => BasisSize;

    /// <summary>A copy with the given hoppings, on-site terms and shells (used by renormalized exports).</summary>
    public BoundModel With(IReadOnlyList<Hopping>? hoppings = null, IReadOnlyList<OnsiteTerm>? onsite = null,
                           IReadOnlyList<CorrelatedShell>? shells = null, string? name = null) => new()
    {
        Name = name ?? Name, Lattice = Lattice, Flavours = Flavours, Sites = Sites, Orbitals = Orbitals,
        Shells = shells ?? Shells, Hoppings = hoppings ?? Hoppings, Onsite = onsite ?? Onsite,
        ElectronsPerCell = ElectronsPerCell, Unit = Unit, FormulaUnitsPerCell = FormulaUnitsPerCell,
        DosHalfWidth = DosHalfWidth, Parameters = Parameters, SourceText = SourceText, SourcePath = SourcePath,
        Solver = Solver,
    };
}
