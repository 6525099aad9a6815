using Meanfield.Analysis;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Nodes;
using Meanfield.Bloch;
using Meanfield.Solver;

namespace Meanfield.Solutions;

/// <summary>How the chemical potential of a <see cref="Solution"/> was fixed.</summary>
public enum ChemicalPotentialRule
{
    /// <summary>N(mu) = N_e with Fermi-Dirac occupations at T &gt; 0.</summary>
    FermiDirac,
    /// <summary>T = 0 and the count is reached inside a band: the filling's own mu.</summary>
    GroundStateInBand,
    /// <summary>T = 0 and the count is reached in a window of no states: the node energy inside it (a semimetal).</summary>
    NodeEnergy,
    /// <summary>T = 0 and the count is reached in a window of no states without a node in it: its middle (an insulator).</summary>
    MiddleOfGap,
    /// <summary>Read from a solution file, as its solve placed it.</summary>
    FromFile,
}

/// <summary>
/// The T = 0 chemical potential where the electron count is reached between bands. At fixed N_e the T -> 0+ limit of
/// mu is the middle of the true gap; in an ideal semimetal the gap closes at the nodes, so mu is the node energy
/// (common practice: N(E) is continuous and increasing except at isolated points). A discrete mesh only shows a window
/// [highest occupied, lowest empty state] around it; this places mu inside that window at the refined node energy, or
/// in its middle when no node lies in it. The occupations (and so the saddle point) are the same anywhere in the window.
/// </summary>
public static class FermiLevelPlacement
{
    /// <summary>The placed mu and the rule used; Nodes is the search that decided (null when none ran).</summary>
    public readonly record struct Placement(double Mu, ChemicalPotentialRule Rule, NodeSearchResult? Nodes);

    /// <summary>
    /// Places mu for <paramref name="occupied"/> filled bands of <paramref name="source"/> given the window
    /// [<paramref name="lower"/>, <paramref name="upper"/>] of no states on the sampling mesh (lower &lt; upper).
    /// </summary>
    /// <param name="source">The Bloch Hamiltonian.</param>
    /// <param name="occupied">Filled bands.</param>
    /// <param name="lower">Highest occupied energy on the mesh.</param>
    /// <param name="upper">Lowest empty energy on the mesh.</param>
    /// <param name="pass">A pass of <paramref name="source"/> (the solve's last) whose gaps seed the node search, or null.</param>
    public static Placement InWindow(IBlochSource source, int occupied, double lower, double upper, ZonePass? pass = null)
    {
        double middle = 0.5 * (lower + upper);
        var nodes = NodeSearch.Find(source, occupied, middle, null, pass);
        var t = nodes.Tolerances;
        if (nodes.Nodes.Count > 0 && !nodes.FermiSurfaceAwayFromNodes && nodes.NodeEnergySpread <= t.Degeneracy)
        {
            double e = nodes.Nodes.Average(n => n.Energy);
            if (e >= lower - t.Pinning && e <= upper + t.Pinning)
                return new(e, ChemicalPotentialRule.NodeEnergy, nodes.At(e));
        }
        return new(middle, ChemicalPotentialRule.MiddleOfGap, nodes);
    }

    /// <summary>
    /// The window of no states around the electron count on a diagonalised mesh: (highest energy of band occupied - 1,
    /// lowest of band occupied), or null when the two bands overlap on the mesh.
    /// </summary>
    public static FermiWindow? Window(MeshSpectrum spectrum, int occupied)
    {
        double v = double.NegativeInfinity, c = double.PositiveInfinity;
        for (int k = 0; k < spectrum.Mesh.Count; k++) { v = Math.Max(v, spectrum.Energy(k, occupied - 1)); c = Math.Min(c, spectrum.Energy(k, occupied)); }
        return c > v ? new FermiWindow(v, c) : null;
    }
}
