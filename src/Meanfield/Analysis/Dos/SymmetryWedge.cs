using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Symmetry;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// The irreducible wedge of a mesh under the operations of a model (found from its bare H(k), as the solver finds
/// them), and whether any operation exchanges sites (then site-resolved weights cannot be copied across an orbit).
/// </summary>
/// <param name="Mesh">The wedge with its orbit weights and the map full point -> wedge point.</param>
/// <param name="ExchangesSites">Some operation maps an orbital of one site onto another site.</param>
public sealed record SymmetryWedge(IrreducibleMesh Mesh, bool ExchangesSites)
{
    /// <summary>
    /// The wedge of <paramref name="mesh"/> for <paramref name="model"/>. The operations are those of the bare model that
    /// map every shell group onto itself, so they are operations of every renormalized Hamiltonian of the model too.
    /// </summary>
    public static SymmetryWedge For(BoundModel model, KMesh mesh) => For(model, SymmetryGroup.Find(new BlochHamiltonian(model)), mesh);

    /// <summary>The wedge of <paramref name="mesh"/> under <paramref name="group"/>, found once for several meshes.</summary>
    public static SymmetryWedge For(BoundModel model, SymmetryGroup group, KMesh mesh)
    {
        int f = model.Flavours, n = model.Orbitals.Count * f;
        bool exchanges = false;
        foreach (var op in group.Operations)
            for (int i = 0; i < n && !exchanges; i++)
                for (int j = 0; j < n; j++)
                    if (model.Orbitals[i / f].Site != model.Orbitals[j / f].Site && op.Unitary[i * n + j] != System.Numerics.Complex.Zero)
                    { exchanges = true; break; }
        return new SymmetryWedge(new IrreducibleMesh(mesh, group), exchanges);
    }
}
