namespace Meanfield.Analysis;

/// <summary>The phase a mean-field solution is labelled with.</summary>
public enum Phase
{
    /// <summary>r = 0: local moments decoupled from the conduction electrons.</summary>
    Decoupled,
    /// <summary>
    /// Spectrum separated by an indirect gap at the chemical potential, its topological class not determined (time
    /// reversal broken in 3D, or the invariants unresolved: the reason says which).
    /// </summary>
    KondoInsulator,
    /// <summary>A Kondo insulator whose Z2 indices all vanish (and, in 2D without time reversal, Chern number 0).</summary>
    TrivialKondoInsulator,
    /// <summary>3D Kondo insulator with nu0 = 0 and a nonzero weak index (Fu, Kane &amp; Mele, PRL 98, 106803 (2007)).</summary>
    WeakTopologicalKondoInsulator,
    /// <summary>3D Kondo insulator with nu0 = 1 (Dzero, Sun, Galitski &amp; Coleman, PRL 104, 106408 (2010)).</summary>
    StrongTopologicalKondoInsulator,
    /// <summary>2D Kondo insulator with Z2 index 1 (quantum spin Hall) or a nonzero Chern number.</summary>
    TopologicalKondoInsulator,
    /// <summary>Twofold touchings of nonzero chirality pinned at the chemical potential, chiralities summing to zero, no other Fermi surface.</summary>
    WeylSemimetal,
    /// <summary>Fourfold touchings of zero net chirality at the chemical potential (or point touchings of a 2D lattice), no other Fermi surface.</summary>
    DiracSemimetal,
    /// <summary>Weyl nodes whose energies miss the chemical potential: small electron and hole pockets around them, no other Fermi surface.</summary>
    WeylSemimetalWithPockets,
    /// <summary>Dirac nodes whose energies miss the chemical potential: small pockets around them, no other Fermi surface.</summary>
    DiracSemimetalWithPockets,
    /// <summary>The touching forms a line.</summary>
    NodalLine,
    /// <summary>A Fermi surface away from any node: the heavy Fermi liquid.</summary>
    HeavyMetal,
    /// <summary>The analysis could not decide (undetermined or non-cancelling chiralities, a touching that would not refine): refine and rerun.</summary>
    Unresolved,
}

/// <summary>A phase with the reason the classifier gave for it.</summary>
public sealed record PhaseLabel(Phase Phase, string Reason)
{
    /// <summary>File form of the phase: lower-case words joined by '-' ("kondo-insulator", "weyl-semimetal", ...).</summary>
    public string Name => PhaseClassifier.Name(Phase);
}

/// <summary>Questions asked of a <see cref="Phase"/>.</summary>
public static class PhaseKinds
{
    /// <summary>True for every Kondo insulator, whatever its topological class.</summary>
    public static bool IsKondoInsulator(this Phase phase) => phase is Phase.KondoInsulator or Phase.TrivialKondoInsulator
        or Phase.WeakTopologicalKondoInsulator or Phase.StrongTopologicalKondoInsulator or Phase.TopologicalKondoInsulator;
}
