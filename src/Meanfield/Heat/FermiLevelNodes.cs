using Meanfield.Analysis.Nodes;
using Meanfield.Binding;

namespace Meanfield.Heat;

/// <summary>
/// The linear band touchings pinned at the Fermi level and their analytic heat C = beta_nodes T^3 (<see cref="NodeHeat"/>),
/// summed over cones: a Weyl node is one two-band cone, a fourfold Dirac node two. Only type-I nodes of an insulating
/// spectrum (no Fermi surface) within <c>pinning</c> of mu count: elsewhere the T^3 law does not describe the heat.
/// </summary>
/// <param name="Nodes">The nodes counted.</param>
/// <param name="Cones">Two-band cones they hold (Weyl 1, Dirac 2 each).</param>
/// <param name="MolarBeta">Sum over cones of (7 pi^2/30) k_B^4 V_cell / |det hbar v| as J mol^-1 K^-4.</param>
/// <param name="MeanHbarV">Cube root of the cone-averaged |det hbar v| (energy unit x angstrom).</param>
public sealed record FermiLevelNodes(IReadOnlyList<WeylNode> Nodes, int Cones, double MolarBeta, double MeanHbarV)
{
    /// <summary>Analytic node C (J mol^-1 K^-1) at <paramref name="temperatureK"/>.</summary>
    public double MolarHeat(double temperatureK) => MolarBeta * temperatureK * temperatureK * temperatureK;

    /// <summary>
    /// The counted nodes of <paramref name="search"/>, or null when none qualifies (metal, no node, nodes away from mu,
    /// type II, or a lattice without three dimensions).
    /// </summary>
    /// <param name="pinning">Largest |E_node - mu| (energy unit) still taken as "at the Fermi level".</param>
    public static FermiLevelNodes? From(NodeSearchResult search, BoundModel model, double pinning)
    {
        if (search.FermiSurfaceAwayFromNodes || search.NodalLineSuspected || model.Lattice.Dimension != 3) return null;
        var counted = search.Nodes.Where(n => Math.Abs(n.EnergyOffset) <= pinning && n.Type == NodeType.TypeI
                                              && n.DetVelocity > 0).ToList();
        if (counted.Count == 0) return null;
        var heat = new NodeHeat(model.Unit, model.Lattice.CellVolume, model.FormulaUnitsPerCell);
        double beta = 0, inverseDet = 0;
        int cones = 0;
        foreach (var n in counted)
        {
            int c = Math.Max(1, n.Degeneracy / 2);
            cones += c;
            beta += heat.MolarBeta(n.DetVelocity, c);
            inverseDet += c / n.DetVelocity;
        }
        return new FermiLevelNodes(counted, cones, beta, Math.Cbrt(cones / inverseDet));
    }
}
