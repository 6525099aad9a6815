namespace Meanfield.Lattices;

/// <summary>The Bravais lattices meanfield knows by name, plus explicit vectors and the momentum-free DOS lattices.</summary>
public enum LatticeKind
{
    SimpleCubic,
    BodyCentredCubic,
    FaceCentredCubic,
    /// <summary>FCC Bravais lattice with the two-site basis (0,0,0) and (a/4)(1,1,1).</summary>
    Diamond,
    Square,
    /// <summary>Triangular Bravais lattice with the two-site basis of graphene.</summary>
    Honeycomb,
    /// <summary>Bravais vectors given explicitly in the model file.</summary>
    Explicit,
    /// <summary>No momentum: a conduction band described by a flat DOS of half-width D.</summary>
    FlatDos,
    /// <summary>No momentum: a conduction band described by a semi-elliptic DOS of half-width D.</summary>
    SemiEllipticDos,
}

public static class LatticeKindExtensions
{
    public static bool IsMomentumFree(this LatticeKind kind) => kind is LatticeKind.FlatDos or LatticeKind.SemiEllipticDos;
}
