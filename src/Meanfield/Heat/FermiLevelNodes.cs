using Meanfield.Analysis.Nodes;
using Meanfield.Binding;

namespace Meanfield.Heat;

/// <summary>
/// The band touchings that can give a T^3 heat: the type-I cones pinned at the T = 0 Fermi level, with their analytic
/// heat C = beta_nodes T^3 (<see cref="NodeHeat"/>, tilt included), summed over cones (a Weyl node is one two-band cone,
/// a fourfold Dirac node two). Type-II nodes and nodes off the Fermi level are kept apart and named, because they give
/// Fermi pockets instead of a T^3 law.
/// </summary>
/// <param name="Pinned">Type-I nodes within the pinning tolerance of E_F: the ones summed.</param>
/// <param name="OffFermiLevel">Type-I nodes farther from E_F: pockets, C ~ gamma T below k_B T ~ |E - E_F|.</param>
/// <param name="TypeII">Nodes whose tilt exceeds the cone (Fermi surface at the node energy, no T^3 law).</param>
/// <param name="FermiLevel">The T = 0 Fermi level the offsets are measured from (energy unit).</param>
/// <param name="Pinning">Largest |E_node - E_F| counted as pinned (energy unit).</param>
/// <param name="Cones">Two-band cones of the pinned nodes (Weyl 1, Dirac 2 each).</param>
/// <param name="MolarBeta">Sum over pinned cones of (7 pi^2/30) k_B^4 V_cell / (|det hbar v| (1 - w^2)^2), J mol^-1 K^-4.</param>
/// <param name="MolarBetaUntilted">The same sum with the tilt left out (w = 0), J mol^-1 K^-4.</param>
/// <param name="MeanHbarV">Cube root of the cone-averaged |det hbar v| (energy unit x angstrom), tilt left out.</param>
public sealed record FermiLevelNodes(IReadOnlyList<WeylNode> Pinned, IReadOnlyList<WeylNode> OffFermiLevel,
                                     IReadOnlyList<WeylNode> TypeII, double FermiLevel, double Pinning, int Cones,
                                     double MolarBeta, double MolarBetaUntilted, double MeanHbarV)
{
    /// <summary>
    /// A node counts as pinned when |E_node - E_F| is at most this fraction of k_B T_min: a cone offset by delta
    /// changes C/T^3 by (5 / (7 pi^2)) (delta / T)^2 (the x^2 moment of the Fermi window, pi^2/3, against the x^4 one,
    /// 7 pi^4/15), 0.45 % at delta = T/4.
    /// </summary>
    public const double PinningFraction = 0.25;

    /// <summary>Effective tilt factor of the pinned cones: beta with tilt over beta without (1 without tilt).</summary>
    public double TiltFactor => MolarBetaUntilted > 0 ? MolarBeta / MolarBetaUntilted : 1;

    /// <summary>Largest tilt ratio |w| among the pinned cones (0 when none).</summary>
    public double LargestTiltRatio => Pinned.Count == 0 ? 0 : Pinned.Max(n => n.TiltRatio);

    /// <summary>Analytic node C (J mol^-1 K^-1) at <paramref name="temperatureK"/> (zero without pinned nodes).</summary>
    public double MolarHeat(double temperatureK) => MolarBeta * temperatureK * temperatureK * temperatureK;

    /// <summary>
    /// Sorts the nodes of <paramref name="search"/> against the T = 0 Fermi level <paramref name="fermiLevel"/>
    /// (energy unit; the node energies are search.ChemicalPotential + EnergyOffset). Nodes without a cone (|det v| = 0)
    /// are left out. <see cref="ArgumentException"/> for a non-positive <paramref name="pinning"/>.
    /// </summary>
    public static FermiLevelNodes From(NodeSearchResult search, BoundModel model, double fermiLevel, double pinning)
    {
        if (!(pinning > 0)) throw new ArgumentException($"pinning tolerance {pinning}: must be positive");
        var pinned = new List<WeylNode>();
        var off = new List<WeylNode>();
        var typeII = new List<WeylNode>();
        foreach (var n in search.Nodes)
        {
            if (!(n.DetVelocity > 0) || !double.IsFinite(n.TiltRatio)) { if (n.Type == NodeType.TypeII) typeII.Add(n); continue; }
            if (n.Type == NodeType.TypeII) typeII.Add(n);
            else if (Math.Abs(Offset(search, n, fermiLevel)) <= pinning) pinned.Add(n);
            else off.Add(n);
        }
        var heat = new NodeHeat(model.Unit, model.Lattice.CellVolume, model.FormulaUnitsPerCell);
        double beta = 0, untilted = 0, inverseDet = 0;
        int cones = 0;
        foreach (var n in pinned)
        {
            int c = Math.Max(1, n.Degeneracy / 2);
            cones += c;
            beta += heat.MolarBeta(n.DetVelocity, c, n.TiltRatio);
            untilted += heat.MolarBeta(n.DetVelocity, c);
            inverseDet += c / n.DetVelocity;
        }
        return new FermiLevelNodes(pinned, off, typeII, fermiLevel, pinning, cones, beta, untilted,
                                   cones > 0 ? Math.Cbrt(cones / inverseDet) : 0);
    }

    /// <summary>E_node - E_F (energy unit) of a node of <paramref name="search"/>.</summary>
    public static double Offset(NodeSearchResult search, WeylNode node, double fermiLevel)
        => search.ChemicalPotential + node.EnergyOffset - fermiLevel;
}
