using Meanfield.Analysis.Nodes;
using Meanfield.Bloch;

namespace Meanfield.Analysis.Topology;

/// <summary>
/// Whether bands n_occ - 1 and n_occ are separated over the whole zone.
/// </summary>
/// <param name="Nodes">Touchings found by <see cref="NodeSearch"/> (gap closings of the direct gap).</param>
/// <param name="MinimumDirectGap">Smallest E_{n_occ} - E_{n_occ-1} found (the refined gap at a node, else on the mesh), energy unit.</param>
/// <param name="IndirectGap">min E_{n_occ} - max E_{n_occ-1} on the mesh (negative when the bands overlap in energy).</param>
/// <param name="Mesh">The search mesh.</param>
public sealed record GapCheckResult(int Nodes, double MinimumDirectGap, double IndirectGap, string Mesh)
{
    /// <summary>Direct gap everywhere (no touching).</summary>
    public bool HasDirectGap => Nodes == 0;
    /// <summary>An insulator at this filling: a direct gap everywhere and a positive indirect gap.</summary>
    public bool IsInsulating => Nodes == 0 && IndirectGap > 0;

    /// <summary>
    /// Nodes are searched by <see cref="NodeSearch"/> (coarse-mesh minima of the gap refined to a touching), so a node
    /// between mesh points is still found.
    /// </summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    public static GapCheckResult Run(IBlochSource source, int occupied, int mesh)
    {
        var nodes = NodeSearch.Find(source, occupied, 0, new NodeSearchOptions { Mesh = mesh });
        double minGap = nodes.Nodes.Count > 0 ? nodes.Nodes.Min(n => n.Gap) : MeshMinimum(source, occupied, mesh);
        return new GapCheckResult(nodes.Nodes.Count, minGap, -nodes.BandOverlap, nodes.Mesh);
    }

    /// <summary>
    /// The check read from a node search already made at this filling and the gaps found with it on a mesh (the spectrum
    /// digest's): the same quantities <see cref="Run"/> computes, without searching again.
    /// </summary>
    public static GapCheckResult From(NodeSearchResult nodes, Gaps.GapReport gaps) =>
        new(nodes.Nodes.Count, nodes.Nodes.Count > 0 ? nodes.Nodes.Min(n => n.Gap) : gaps.Direct, -nodes.BandOverlap, nodes.Mesh);

    private static double MeshMinimum(IBlochSource source, int occupied, int mesh)
    {
        var sp = Dos.MeshSpectrum.Compute(source, new Lattices.KMesh(source.Model.Lattice, mesh), false);
        double best = double.PositiveInfinity;
        for (int k = 0; k < sp.Mesh.Count; k++) best = Math.Min(best, sp.Energy(k, occupied) - sp.Energy(k, occupied - 1));
        return best;
    }
}
