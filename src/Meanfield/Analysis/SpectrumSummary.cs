using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis;

/// <summary>
/// The cheap per-solution spectral digest shown by `solve` and stored per scan point: gaps, nodes near the Fermi
/// level, the Fermi-level DOS and the phase label. Energies in the model's unit; DOS in states per cell per energy unit
/// (all flavours). Gaps and node fields are NaN / 0 when the filling is not an integer number of bands (a metal).
/// </summary>
/// <param name="DirectGap">min_k [E_nocc(k) - E_nocc-1(k)] on the mesh.</param>
/// <param name="IndirectGap">min_k E_nocc - max_k E_nocc-1 on the mesh (negative for overlapping bands).</param>
/// <param name="NodeCount">Band touchings between bands n_occ - 1 and n_occ found in the zone.</param>
/// <param name="MaxNodeOffset">Largest |E_node - mu| over the nodes (NaN without nodes).</param>
/// <param name="NetChirality">Sum of node chiralities (zero over a complete search).</param>
/// <param name="AbsChirality">Sum of |chirality|: twice the number of Weyl pairs.</param>
public sealed record SpectrumDigest(
    double DirectGap, double IndirectGap, double DosFermiTotal, double DosFermiCorrelated,
    int NodeCount, double MaxNodeOffset, int NetChirality, int AbsChirality, Phase Phase, string PhaseReason,
    NodeSearchResult? Nodes, GapReport? Gaps)
{
    /// <summary>Phase label as written into files: "kondo-insulator", "weyl-semimetal", ...</summary>
    public string PhaseName => SpectrumSummary.Name(Phase);
}

/// <summary>Computes a <see cref="SpectrumDigest"/>; the one place `solve` and scans get their phase label from.</summary>
public static class SpectrumSummary
{
    /// <summary>Coarse mesh of the node search inside the digest: enough for the shipped models' node pairs.</summary>
    public const int DefaultSearchMesh = 10;

    /// <summary>
    /// Digest of <paramref name="renormalized"/> at chemical potential <paramref name="mu"/>. The DOS and gaps use a
    /// Gamma-centred mesh with the divisions of <paramref name="mesh"/> (the tetrahedron method needs the zone centre);
    /// nodes are searched on a <paramref name="searchMesh"/> mesh. Nodes count as "at the Fermi level" within
    /// max(1e-3 bandwidth, <paramref name="energyTolerance"/>): a finite-temperature mean-field mu sits at the node
    /// only up to terms of order T^2, and a node that small a fraction of the band away leaves Fermi pockets too small
    /// to matter next to the cone (the Weyl-Kondo regime).
    /// </summary>
    public static SpectrumDigest Compute(IBlochSource renormalized, BoundModel model, double mu, bool decoupled, KMesh mesh,
                                         int searchMesh = DefaultSearchMesh, double energyTolerance = 0)
    {
        if (model.IsMomentumFree) throw new ArgumentException("A momentum-free lattice has no k-resolved spectrum to classify.");
        var gammaMesh = new KMesh(mesh.Lattice, mesh.N1, mesh.N2, mesh.N3, shifted: false);
        var dos = new TetrahedronDos(renormalized, gammaMesh);
        var (lo, hi) = dos.Spectrum.Range();
        double width = Math.Max(hi - lo, 1e-300);
        var atMu = dos.DosAtEnergy(mu);
        double electrons = model.ElectronsPerCell;
        int occupied = (int)Math.Round(electrons);
        bool integer = Math.Abs(electrons - occupied) < 1e-9 && occupied >= 1 && occupied < renormalized.Size;
        var tol = Tolerances(width, energyTolerance);
        if (!integer)
        {
            var label = decoupled ? new PhaseLabel(Phase.Decoupled, "all boson amplitudes vanish (r = 0)")
                                  : new PhaseLabel(Phase.HeavyMetal, $"{electrons:G6} electrons per cell fill a band partly");
            return new(double.NaN, double.NaN, atMu.Total, atMu.Correlated, 0, double.NaN, 0, 0, label.Phase, label.Reason, null, null);
        }
        var gaps = GapFinder.Find(dos.Spectrum, occupied);
        var nodes = NodeSearch.Find(renormalized, occupied, mu, new NodeSearchOptions { Mesh = searchMesh });
        var phase = PhaseClassifier.Classify(decoupled, gaps, nodes, atMu.Total, tol);
        double maxOffset = nodes.Nodes.Count == 0 ? double.NaN : nodes.Nodes.Max(n => Math.Abs(n.EnergyOffset));
        return new(gaps.Direct, gaps.Indirect, atMu.Total, atMu.Correlated, nodes.Nodes.Count, maxOffset,
                   nodes.ChiralitySum, nodes.Nodes.Sum(n => Math.Abs(n.Chirality)), phase.Phase, phase.Reason, nodes, gaps);
    }

    /// <summary>
    /// Tolerances of the phase label for a spectrum of total width <paramref name="width"/>: a gap counts above 1e-6 of
    /// the width; a node is "at mu" within max(1e-3 width, <paramref name="temperature"/>); the DOS at mu counts above
    /// 1e-3 state per cell per width.
    /// </summary>
    public static PhaseClassifier.Tolerances Tolerances(double width, double temperature) =>
        new(GapTolerance: 1e-6 * width, EnergyTolerance: Math.Max(1e-3 * width, temperature), DosTolerance: 1e-3 / width);

    /// <summary>File form of a phase: lower-case words joined by '-'.</summary>
    public static string Name(Phase phase) => phase switch
    {
        Phase.Decoupled => "decoupled",
        Phase.KondoInsulator => "kondo-insulator",
        Phase.WeylSemimetal => "weyl-semimetal",
        Phase.DiracSemimetal => "dirac-semimetal",
        Phase.NodalLine => "nodal-line",
        _ => "heavy-metal",
    };
}
