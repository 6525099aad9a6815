namespace Meanfield.Solver;

/// <summary>
/// The one-particle states of the mean-field Hamiltonian at fixed amplitudes, as the saddle point needs them: for each
/// state (k-point or energy node, band) its energy, its weight in the cell average, its f weight per shell group
/// (sum over the group's f components of |psi_i|^2) and dE/dr_g = &lt;psi| dH_MF/dr_g |psi&gt; (Hellmann-Feynman).
/// Eigenvectors are not kept: memory is (2 + 2G) doubles per state.
/// </summary>
public sealed class StateTable
{
    public int Count { get; }
    public int Groups { get; }
    public double[] Energy { get; }
    public double[] Weight { get; }
    /// <summary>f weight, index state * Groups + g.</summary>
    public double[] FWeight { get; }
    /// <summary>dE/dr_g, index state * Groups + g (energy unit).</summary>
    public double[] EnergySlope { get; }
    /// <summary>
    /// True for a k-mesh: every weight is an integer multiple of 1 / (full mesh) (1 on the full mesh, the orbit size on an
    /// irreducible wedge), so exact degeneracies at the Fermi level are meaningful.
    /// </summary>
    public bool UniformWeights { get; }

    public StateTable(int count, int groups, bool uniformWeights)
    {
        Count = count; Groups = groups; UniformWeights = uniformWeights;
        Energy = new double[count]; Weight = new double[count];
        FWeight = new double[count * groups]; EnergySlope = new double[count * groups];
    }

    public double TotalWeight()
    {
        double s = 0;
        foreach (var w in Weight) s += w;
        return s;
    }
}
