namespace Meanfield.Analysis.Nodes;

/// <summary>
/// All touchings of bands n_occ - 1 and n_occ found in the zone, with the flags needed to read them.
/// </summary>
/// <param name="Nodes">Distinct nodes (modulo reciprocal lattice vectors).</param>
/// <param name="ChiralitySum">Sum of chiralities; zero over a complete search (Nielsen &amp; Ninomiya 1981).</param>
/// <param name="IsMetal">Bands n_occ - 1 and n_occ overlap in energy across the zone, or the chemical potential cuts
/// one of them: there is a Fermi surface and the spectrum is not separated.</param>
/// <param name="BandOverlap">max E_{n_occ-1} - min E_{n_occ} over the coarse mesh (positive when they overlap).</param>
/// <param name="NodalLineSuspected">Many touching points, or cones with a flat direction: the touching forms a line.</param>
/// <param name="Warnings">Plain-language warnings (mesh too coarse, chiralities not summing to zero, ...).</param>
public sealed record NodeSearchResult(
    IReadOnlyList<WeylNode> Nodes, int ChiralitySum, bool IsMetal, double BandOverlap, bool NodalLineSuspected,
    IReadOnlyList<string> Warnings, int OccupiedBands, double ChemicalPotential, string Mesh);
