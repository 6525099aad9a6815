using Meanfield.Analysis.Symmetry;

namespace Meanfield.Analysis.Responses;

/// <summary>
/// The components of the Berry curvature dipole that a point group allows. D is a pseudotensor (a polar derivative
/// index times the axial curvature; Sodemann &amp; Fu, PRL 115, 216806 (2015)): an operation g maps D to
/// det(g) g D g^T, so the allowed tensors are the range of the group average of that map (an orthogonal projector on
/// the 9 components).
/// </summary>
public static class DipoleSymmetry
{
    /// <summary>
    /// An orthonormal basis (each 9 numbers, row-major D_ab) of the tensors invariant under every operation, entries
    /// below 1e-12 set to zero; empty when the group forbids any dipole (for example with inversion).
    /// </summary>
    /// <exception cref="ArgumentException">No operations (the identity at least is expected).</exception>
    public static IReadOnlyList<double[]> AllowedBasis(IReadOnlyList<SpaceOperation> operations)
    {
        var p = Projector(operations);
        var evd = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseOfArray(p).Evd(MathNet.Numerics.LinearAlgebra.Symmetricity.Symmetric);
        var basis = new List<double[]>();
        for (int i = 0; i < 9; i++)
        {
            if (evd.EigenValues[i].Real < 0.5) continue;
            var v = evd.EigenVectors.Column(i).ToArray();
            int big = 0;
            for (int j = 1; j < 9; j++) if (Math.Abs(v[j]) > Math.Abs(v[big]) + 1e-9) big = j;
            double sign = v[big] < 0 ? -1 : 1;
            basis.Add(v.Select(x => Math.Abs(x) < 1e-12 ? 0 : sign * x).ToArray());
        }
        return basis;
    }

    /// <summary>The orthogonal projector (9 x 9) onto the allowed tensors: the group average of X -> det(g) g X g^T.</summary>
    /// <exception cref="ArgumentException">No operations.</exception>
    public static double[,] Projector(IReadOnlyList<SpaceOperation> operations)
    {
        if (operations.Count == 0) throw new ArgumentException("at least the identity is needed", nameof(operations));
        var p = new double[9, 9];
        foreach (var op in operations)
        {
            var g = op.Rotation;
            double det = op.Determinant;
            // (g X g^T)_ab = g_ac X_cd g_bd: the coefficient of X_cd in component ab is g_ac g_bd.
            for (int a = 0; a < 3; a++)
                for (int b = 0; b < 3; b++)
                    for (int c = 0; c < 3; c++)
                        for (int d = 0; d < 3; d++)
                            p[a * 3 + b, c * 3 + d] += det * g[a * 3 + c] * g[b * 3 + d] / operations.Count;
        }
        return p;
    }

    /// <summary>The part of <paramref name="tensor"/> (row-major D_ab) the group allows: the projector applied to it.</summary>
    public static double[] Symmetrize(IReadOnlyList<SpaceOperation> operations, double[] tensor)
    {
        var p = Projector(operations);
        var r = new double[9];
        for (int i = 0; i < 9; i++)
            for (int j = 0; j < 9; j++) r[i] += p[i, j] * tensor[j];
        return r;
    }

    /// <summary>Components (a, b) that vanish for every allowed tensor, as "xy"-style names.</summary>
    public static IReadOnlyList<string> ForbiddenComponents(IReadOnlyList<SpaceOperation> operations)
    {
        var basis = AllowedBasis(operations);
        const string axes = "xyz";
        var list = new List<string>();
        for (int i = 0; i < 9; i++)
            if (basis.All(v => Math.Abs(v[i]) < 1e-9)) list.Add($"{axes[i / 3]}{axes[i % 3]}");
        return list;
    }
}
