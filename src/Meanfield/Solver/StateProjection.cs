using System.Numerics;

namespace Meanfield.Solver;

/// <summary>
/// Reduces the eigenvectors of one k-point (or DOS node) to what the saddle point needs, straight into a
/// <see cref="StateTable"/>: per band the energy, the f weight per group and dE/dr_g, with
/// &lt;psi| dH_MF/dr_g |psi&gt; = 2 Re sum_{i in g} conj(psi_i) (S G psi)_i (S: bare scaled part, G: boson scales).
/// </summary>
internal static class StateProjection
{
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // hot loop: skip tier-0 code
    public static void Store(StateTable table, int firstState, int n, ReadOnlySpan<double> energies, ReadOnlySpan<Complex> vectors,
                             ReadOnlySpan<Complex> scaled, ReadOnlySpan<double> scale, ReadOnlySpan<int> fIndex, ReadOnlySpan<int> fGroup)
    {
        int groups = table.Groups;
        for (int m = 0; m < n; m++)
        {
            int state = firstState + m, gBase = state * groups;
            table.Energy[state] = energies[m];
            for (int g = 0; g < groups; g++) { table.FWeight[gBase + g] = 0; table.EnergySlope[gBase + g] = 0; }
            for (int a = 0; a < fIndex.Length; a++)
            {
                int i = fIndex[a], g = fGroup[a], row = i * n;
                var vi = vectors[row + m];
                var sg = ScaledRowProduct.At(scaled, row, vectors, m, n, scale); // sum_j S_ij (g_j psi_j)
                table.FWeight[gBase + g] += vi.Real * vi.Real + vi.Imaginary * vi.Imaginary;
                table.EnergySlope[gBase + g] += 2 * (vi.Real * sg.Real + vi.Imaginary * sg.Imaginary);
            }
        }
    }

    /// <summary>The correlated basis indices and their groups, for <see cref="Store"/>.</summary>
    public static (int[] Index, int[] Group) CorrelatedIndices(ReadOnlySpan<int> groupOfBasis)
    {
        var idx = new List<int>(); var grp = new List<int>();
        for (int i = 0; i < groupOfBasis.Length; i++) if (groupOfBasis[i] >= 0) { idx.Add(i); grp.Add(groupOfBasis[i]); }
        return ([.. idx], [.. grp]);
    }
}
