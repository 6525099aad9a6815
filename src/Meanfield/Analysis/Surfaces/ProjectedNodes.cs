using Meanfield.Analysis.Nodes;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>A bulk node projected onto the surface zone: in-plane k (folded next to Γ), map coordinates, the summed
/// chirality of every node that projects there (nodes of opposite chirality on one point sum to 0), how many nodes
/// do, and how many of those have an undetermined chirality (counted as 0 in <paramref name="Chirality"/>).</summary>
public sealed record ProjectedNode(Vec3 KPar, double S1, double S2, int Chirality, int Count, int Undetermined = 0);

/// <summary>Projections of the bulk band-touching nodes (found by <see cref="NodeSearch"/>) onto a surface zone.</summary>
public static class ProjectedNodes
{
    /// <summary>Nodes projecting within this fraction of the shortest surface reciprocal vector are one point.</summary>
    public const double MergeTolerance = 1e-4;

    /// <summary>
    /// Searches the nodes between band n_occ - 1 and n_occ (n_occ = electrons per cell, which must be a whole number)
    /// and projects them. Returns an empty list, with a note, for a partly filled band.
    /// </summary>
    public static (IReadOnlyList<ProjectedNode> Nodes, string? Note) Find(IBlochSource source, SurfaceZone zone, double mu, int searchMesh = 16)
    {
        double ne = source.Model.ElectronsPerCell;
        int occ = (int)Math.Round(ne);
        if (Math.Abs(ne - occ) > 1e-9 || occ < 1 || occ >= source.Size)
            return ([], $"no node search: {ne:G6} electrons per cell do not fill whole bands");
        var result = NodeSearch.Find(source, occ, mu, new NodeSearchOptions { Mesh = searchMesh });
        // An undetermined chirality is drawn as 0 and said so: no charge is invented for it.
        int undetermined = result.Nodes.Count(n => n.Chirality is null && n.SphereRadius > 0);
        return (Project(zone, result.Nodes.Select(n => (n.Cartesian, n.Chirality))),
                undetermined > 0 ? $"{undetermined} node chiralities undetermined (drawn as 0)" : null);
    }

    /// <summary>Projects bulk nodes (Cartesian k, chirality or null when undetermined) and merges those that land on
    /// one surface point.</summary>
    public static IReadOnlyList<ProjectedNode> Project(SurfaceZone zone, IEnumerable<(Vec3 K, int? Chirality)> nodes)
    {
        double tol = MergeTolerance * Math.Min(zone.B1.Norm, zone.B2.Norm);
        var list = new List<ProjectedNode>();
        foreach (var (k, c) in nodes)
        {
            int chi = c ?? 0, unknown = c is null ? 1 : 0;
            var p = zone.Project(k);
            int at = list.FindIndex(q => Folded(zone, q.KPar - p) < tol);
            if (at >= 0) list[at] = list[at] with { Chirality = list[at].Chirality + chi, Count = list[at].Count + 1, Undetermined = list[at].Undetermined + unknown };
            else
            {
                var (s1, s2) = zone.MapCoordinates(p);
                list.Add(new ProjectedNode(p, s1, s2, chi, 1, unknown));
            }
        }
        return list;
    }

    private static double Folded(SurfaceZone zone, Vec3 d) => zone.Project(d).Norm;
}
