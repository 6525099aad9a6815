using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>
/// What consecutive solves of models with one structure (the points of a scan segment) share instead of rebuilding:
/// the symmetry group of the previous model when every one of its operations still holds
/// (<see cref="SymmetryGroup.CarriedOver"/>), the irreducible wedge per mesh and group, and the state buffers of the
/// last sum over each wedge. Every result is the same as without it (a carried-over group is a subgroup of the new
/// model's symmetry, which sums exactly). Not thread-safe: one solve at a time uses an instance.
/// </summary>
public sealed class SolveReuse
{
    private SymmetryGroup? _group, _trivial;
    private readonly List<(IrreducibleMesh Wedge, MeshStateSum? Last)> _wedges = [];
    /// <summary>Wedges kept (the fine mesh and its half-mesh start need two; more mean the mesh or group changed).</summary>
    private const int KeptWedges = 4;

    /// <summary>Groups carried over from the previous model (for benchmarks).</summary>
    public int GroupsCarriedOver { get; private set; }
    /// <summary>Groups searched afresh.</summary>
    public int GroupsSearched { get; private set; }

    /// <summary>The group for <paramref name="bare"/>: the previous one when it still holds (automatic search only), else a fresh search.</summary>
    internal SymmetryGroup Group(BlochHamiltonian bare, SymmetryRequest request)
    {
        // The identity alone depends on the basis size only; kept so that its wedges are found again too.
        if (request.Disabled)
            return _trivial is { } t && t.Operations[0].Unitary.Length == bare.Size * bare.Size ? t : _trivial = SymmetryGroup.Trivial(bare);
        if (request == SymmetryRequest.Auto && _group?.CarriedOver(bare) is { } carried) { GroupsCarriedOver++; return _group = carried; }
        var found = SymmetryGroup.Find(bare, request);
        GroupsSearched++;
        if (request == SymmetryRequest.Auto) _group = found;
        return found;
    }

    /// <summary>
    /// The wedge of <paramref name="mesh"/> under <paramref name="group"/>'s operations, built once per mesh and group.
    /// A wedge built for an earlier model serves when the group's operations are the same objects (a carried-over group)
    /// and the mesh has the same divisions and shift: the lattice vectors are then equal too.
    /// </summary>
    internal IrreducibleMesh Wedge(KMesh mesh, SymmetryGroup group)
    {
        foreach (var (w, _) in _wedges)
            if (ReferenceEquals(w.Group.Operations, group.Operations) && w.Mesh.N1 == mesh.N1 && w.Mesh.N2 == mesh.N2
                && w.Mesh.N3 == mesh.N3 && w.Mesh.Shifted == mesh.Shifted && SameVectors(w.Mesh.Lattice, mesh.Lattice)) return w;
        var wedge = new IrreducibleMesh(mesh, group);
        if (_wedges.Count == KeptWedges) _wedges.RemoveAt(0);
        _wedges.Add((wedge, null));
        return wedge;
    }

    private static bool SameVectors(Lattice a, Lattice b) =>
        ReferenceEquals(a, b) || (a.Dimension == b.Dimension && a.A1 == b.A1 && a.A2 == b.A2 && a.A3 == b.A3);

    /// <summary>
    /// A sum over <paramref name="wedge"/> made by <paramref name="make"/> from the last sum over the same wedge (whose
    /// buffers it takes over; null for the first), remembered as the new last. The previous solve is finished by then.
    /// </summary>
    internal MeshStateSum Sum(IrreducibleMesh wedge, Func<MeshStateSum?, MeshStateSum> make)
    {
        for (int i = 0; i < _wedges.Count; i++)
            if (ReferenceEquals(_wedges[i].Wedge, wedge))
            {
                var sum = make(_wedges[i].Last);
                _wedges[i] = (wedge, sum);
                return sum;
            }
        return make(null);
    }
}
