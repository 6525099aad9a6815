namespace Meanfield.Analysis.Nodes;

/// <summary>
/// All touchings of bands n_occ - 1 and n_occ found in the zone, with the flags needed to read them. Reported whatever
/// the chemical potential does: each node carries its offset from mu.
/// </summary>
/// <param name="Nodes">Distinct nodes (modulo reciprocal lattice vectors), ordered by orbit.</param>
/// <param name="ChiralitySum">Sum of chiralities when every one is determined (zero over a complete search: Nielsen &amp;
/// Ninomiya, Nucl. Phys. B 185, 20 (1981)); null when some chirality is undetermined or the lattice is 2D.</param>
/// <param name="BandOverlap">max E_{n_occ-1} - min E_{n_occ} over the coarse mesh and the nodes (positive when the two
/// bands overlap in energy).</param>
/// <param name="NodeEnergySpread">Highest minus lowest node energy (0 without nodes).</param>
/// <param name="FermiSurfaceAwayFromNodes">The bands overlap by more than the node energies explain: a Fermi surface that
/// is not a pocket around the nodes (a metal).</param>
/// <param name="NodalLineSuspected">Many touching points, or cones with a flat direction: the touching forms a line.</param>
/// <param name="UnresolvedMinima">Coarse gap minima that fell below the gap tolerance but did not refine to a touching.</param>
/// <param name="Warnings">Plain-language warnings (mesh too coarse, chiralities not summing to zero, ...).</param>
/// <param name="Tolerances">The scales and tolerances the search judged by.</param>
/// <param name="Dimension">Dimension of the lattice (2 or 3).</param>
public sealed record NodeSearchResult(
    IReadOnlyList<WeylNode> Nodes, int? ChiralitySum, double BandOverlap, double NodeEnergySpread,
    bool FermiSurfaceAwayFromNodes, bool NodalLineSuspected, int UnresolvedMinima,
    IReadOnlyList<string> Warnings, int OccupiedBands, double ChemicalPotential, string Mesh, SpectrumTolerances Tolerances, int Dimension)
{
    /// <summary>Every node's chirality is determined (3D), or none is defined (2D).</summary>
    public bool ChiralitiesResolved => Dimension != 3 || Nodes.All(n => n.Chirality is not null);

    /// <summary>
    /// The same search read against another chemical potential: only the offsets and pinning depend on mu (the search,
    /// its scales and its warnings do not), so the nodes are not searched or diagonalised again.
    /// </summary>
    public NodeSearchResult At(double chemicalPotential) => this with
    {
        ChemicalPotential = chemicalPotential,
        Nodes = [.. Nodes.Select(n => n with { EnergyOffset = n.Energy - chemicalPotential, Pinning = NodeSearch.Pin(n.Energy - chemicalPotential, Tolerances) })],
    };

    /// <summary>Sum of |chirality| over the determined ones: twice the number of Weyl pairs.</summary>
    public int AbsChirality => Nodes.Sum(n => Math.Abs(n.Chirality ?? 0));
}
