namespace Meanfield.Analysis.Topology;

/// <summary>How the Z2 indices classify an insulator (Fu, Kane &amp; Mele, PRL 98, 106803 (2007)).</summary>
public enum Z2Class
{
    /// <summary>All indices zero.</summary>
    Trivial,
    /// <summary>3D: nu0 = 0 with a nonzero weak index (stacked 2D topological layers).</summary>
    Weak,
    /// <summary>3D: nu0 = 1. In 2D: nu = 1 (quantum spin Hall).</summary>
    Strong,
}

/// <summary>
/// Z2 indices. 3D: (nu0; nu1 nu2 nu3) with G_nu = nu1 b1 + nu2 b2 + nu3 b3 (Fu &amp; Kane, PRB 76, 045302 (2007));
/// 2D: the single index nu (stored as <see cref="Nu0"/>; <see cref="Weak"/> is empty).
/// </summary>
public sealed record Z2Indices(int Dimension, int Nu0, IReadOnlyList<int> Weak)
{
    /// <summary>Strong if nu0 = 1, weak if only a weak index is nonzero, else trivial.</summary>
    public Z2Class Class => Nu0 == 1 ? Z2Class.Strong : Weak.Any(w => w != 0) ? Z2Class.Weak : Z2Class.Trivial;

    /// <summary>"(1;111)" in 3D, "1" in 2D.</summary>
    public override string ToString() => Dimension == 3 ? $"({Nu0};{string.Concat(Weak)})" : $"{Nu0}";

    /// <summary>Same indices (dimension, nu0 and every weak index).</summary>
    public bool SameAs(Z2Indices other) => Dimension == other.Dimension && Nu0 == other.Nu0 && Weak.SequenceEqual(other.Weak);
}
