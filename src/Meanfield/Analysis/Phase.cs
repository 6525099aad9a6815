namespace Meanfield.Analysis;

/// <summary>The phase a mean-field solution is labelled with.</summary>
public enum Phase
{
    /// <summary>r = 0: local moments decoupled from the conduction electrons.</summary>
    Decoupled,
    /// <summary>Spectrum separated by an indirect gap at the chemical potential.</summary>
    KondoInsulator,
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
