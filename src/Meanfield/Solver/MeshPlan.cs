using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>What a solve of a model on a mesh will sum over, before any diagonalisation (library side of `meanfield info MODEL`).</summary>
/// <param name="Group">The symmetry found or requested.</param>
/// <param name="Reduction">The wedge of the mesh, or null for momentum-free lattices.</param>
/// <param name="EstimatedBytes">Memory of the saddle-point sums (fine and half-mesh start), bytes; 0 without momentum.</param>
/// <param name="AvailableBytes">Memory the machine offers, bytes.</param>
/// <param name="KeepsVectors">Whether eigenvectors fit for the analytic Jacobian.</param>
public sealed record MeshPlan(SymmetryGroup Group, MeshReduction? Reduction, long EstimatedBytes, long AvailableBytes, bool KeepsVectors)
{
    /// <summary>Finds the symmetry, checks the memory and builds the wedge (no diagonalisation).</summary>
    /// <exception cref="ArgumentException">A requested operation is broken.</exception>
    /// <exception cref="RequestError">Settings out of range, or the mesh does not fit in memory.</exception>
    public static MeshPlan For(BoundModel model, SolverSettings settings)
    {
        settings.Validate();
        var bare = new BlochHamiltonian(model);
        var group = SymmetryGroup.Find(bare, settings.Symmetry);
        if (model.IsMomentumFree) return new MeshPlan(group, null, 0, MeshMemory.Available, true);
        bool keep = MeshMemory.Check(model, settings, group, out var mesh);
        var wedge = new IrreducibleMesh(mesh, group);
        var (_, _, bytes, withVectors) = MeshMemory.Estimate(model, settings, group);
        var reduction = new MeshReduction(group.Order, group.UnitaryCount, wedge.ActionCount, mesh.Count, wedge.Count,
                                          [.. group.Operations.Select(o => o.Name)]);
        return new MeshPlan(group, reduction, keep ? withVectors : bytes, MeshMemory.Available, keep);
    }
}
