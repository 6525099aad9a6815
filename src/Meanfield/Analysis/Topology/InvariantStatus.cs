namespace Meanfield.Analysis.Topology;

/// <summary>Whether an invariant could be computed, and if not, why.</summary>
public enum InvariantStatus
{
    /// <summary>The invariant is determined (an integer, or the Z2 indices).</summary>
    Determined,
    /// <summary>No gap at the electron count: bands touch (nodes) or overlap in energy. There is no invariant to give.</summary>
    Gapless,
    /// <summary>The invariant is not defined for this Hamiltonian (for example Z2 without time reversal).</summary>
    NotApplicable,
    /// <summary>The calculation could not settle the answer (unresolved flow, methods or planes disagree).</summary>
    Unresolved,
}
