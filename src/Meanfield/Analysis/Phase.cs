namespace Meanfield.Analysis;

/// <summary>The phase a mean-field solution is labelled with.</summary>
public enum Phase
{
    /// <summary>r = 0: local moments decoupled from the conduction electrons.</summary>
    Decoupled,
    /// <summary>Spectrum separated by an indirect gap at the chemical potential.</summary>
    KondoInsulator,
    /// <summary>Twofold touchings of nonzero chirality at the chemical potential, no other Fermi surface.</summary>
    WeylSemimetal,
    /// <summary>Fourfold touchings of zero net chirality at the chemical potential, no other Fermi surface.</summary>
    DiracSemimetal,
    /// <summary>The touching forms a line at the chemical potential.</summary>
    NodalLine,
    /// <summary>A Fermi surface: the heavy Fermi liquid.</summary>
    HeavyMetal,
}

/// <summary>A phase with the reason the classifier gave for it.</summary>
public sealed record PhaseLabel(Phase Phase, string Reason);
