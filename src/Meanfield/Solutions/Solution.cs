using Meanfield.Analysis.Nodes;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Output;
using Meanfield.Renormalization;
using Meanfield.Solver;

namespace Meanfield.Solutions;

/// <summary>Where a <see cref="Solution"/> came from.</summary>
public enum SolutionOrigin
{
    /// <summary>Solved in this process.</summary>
    Solved,
    /// <summary>Read from a solution file written by `solve`.</summary>
    File,
    /// <summary>The bare model: f levels and hybridization unrenormalized, no saddle point.</summary>
    BareModel,
    /// <summary>An exported one-body model (`export`): a plain model without correlated shell, mu as exported.</summary>
    ExportedModel,
}

/// <summary>
/// The one handle every analysis works on: the bound model, its (renormalized or bare) Bloch Hamiltonian, the saddle
/// point's amplitudes, the sampling mesh, the temperature and the chemical potential, and where it came from. Built
/// once by <see cref="FromSaddlePoint"/>, <see cref="Load"/> or <see cref="Bare"/>; immutable.
/// </summary>
public sealed class Solution
{
    /// <summary>The bound model (parameters as solved).</summary>
    public BoundModel Model { get; }
    /// <summary>H_MF(k) of the saddle point, or the bare H(k).</summary>
    public IBlochSource Hamiltonian { get; }
    /// <summary>(r, lambda) per shell group; null for the bare model.</summary>
    public MeanFieldAmplitudes? Amplitudes { get; }
    /// <summary>The saddle point when solved in this process (null for files and bare models).</summary>
    public SaddlePoint? SaddlePoint { get; }
    /// <summary>The sampling mesh of the solve (null for momentum-free lattices).</summary>
    public KMesh? Mesh { get; }
    /// <summary>Chemical potential (energy unit).</summary>
    public double Mu { get; }
    /// <summary>How <see cref="Mu"/> was fixed.</summary>
    public ChemicalPotentialRule MuRule { get; }
    /// <summary>k_B T (energy unit).</summary>
    public double Temperature { get; }
    /// <summary>True on the r = 0 (local-moment) branch.</summary>
    public bool Decoupled { get; }
    public SolutionOrigin Origin { get; }
    /// <summary>The solution file, for <see cref="SolutionOrigin.File"/>; otherwise null.</summary>
    public string? SourcePath { get; }
    /// <summary>The node search that placed mu (T = 0 between bands), reused by the spectrum digest; null otherwise.</summary>
    internal NodeSearchResult? PlacementNodes { get; }
    /// <summary>
    /// The solve's final pass over <see cref="Mesh"/> at this solution's amplitudes, when it was kept and its f weights
    /// cover exactly the correlated orbitals: the digest reads gaps, the DOS at mu and node seeds from it. Null otherwise.
    /// </summary>
    internal ZonePass? FinalPass => SaddlePoint?.FinalPass is { } p && Mesh is { } m && p.Wedge.Mesh.N1 == m.N1 && p.Wedge.Mesh.N2 == m.N2
                                    && p.Wedge.Mesh.N3 == m.N3 && p.Wedge.Mesh.Shifted == m.Shifted && Amplitudes is { } a && p.MadeAt(a)
                                    && FWeightsAreCorrelated(Model) ? p : null;

    private static bool FWeightsAreCorrelated(BoundModel model)
    {
        var withShell = model.Shells.Select(s => s.Orbital).ToHashSet();
        for (int o = 0; o < model.Orbitals.Count; o++)
            if ((model.Orbitals[o].Kind == OrbitalKind.Correlated) != withShell.Contains(o)) return false;
        return true;
    }

    /// <summary>What an exported model's file says about itself, for <see cref="SolutionOrigin.ExportedModel"/>; otherwise null.</summary>
    public OneBodyHeader? ExportHeader { get; private init; }

    private Solution(BoundModel model, IBlochSource hamiltonian, MeanFieldAmplitudes? amplitudes, SaddlePoint? saddlePoint,
                     KMesh? mesh, FermiLevelPlacement.Placement placement, double temperature, bool decoupled,
                     SolutionOrigin origin, string? sourcePath)
    {
        Model = model; Hamiltonian = hamiltonian; Amplitudes = amplitudes; SaddlePoint = saddlePoint; Mesh = mesh;
        Mu = placement.Mu; MuRule = placement.Rule; PlacementNodes = placement.Nodes;
        Temperature = temperature; Decoupled = decoupled; Origin = origin; SourcePath = sourcePath;
    }

    /// <summary>Electrons per cell fill a whole number of bands, between 1 and Size - 1: gaps and nodes are defined.</summary>
    public bool WholeFilling => Model.ElectronsPerCell >= 1 && Model.ElectronsPerCell < Hamiltonian.Size
                                && Math.Abs(Model.ElectronsPerCell - Math.Round(Model.ElectronsPerCell)) <= WholeFillingTolerance;

    /// <summary>Filled bands n_occ (meaningful when <see cref="WholeFilling"/>).</summary>
    public int OccupiedBands => (int)Math.Round(Model.ElectronsPerCell);

    /// <summary>Electron counts within this of an integer fill whole bands (electrons per cell).</summary>
    public const double WholeFillingTolerance = 1e-9;

    /// <summary>Plain words for the origin: "solved", "solution file PATH", "bare model".</summary>
    public string OriginText => Origin switch
    {
        SolutionOrigin.File => $"solution file {SourcePath}",
        SolutionOrigin.BareModel => "bare model",
        SolutionOrigin.ExportedModel => $"exported model {SourcePath}",
        _ => "solved",
    };

    /// <summary>
    /// The handle of a converged saddle point of <paramref name="model"/> solved with <paramref name="settings"/>. At T = 0
    /// with a whole filling, mu is placed by <see cref="FermiLevelPlacement"/> (the node energy of a semimetal).
    /// </summary>
    /// <exception cref="ArgumentException">The saddle point did not converge.</exception>
    public static Solution FromSaddlePoint(BoundModel model, SaddlePoint saddlePoint, SolverSettings settings)
    {
        if (!saddlePoint.Converged) throw new ArgumentException("a solution handle needs a converged saddle point");
        var ham = new RenormalizedHamiltonian(new BlochHamiltonian(model), saddlePoint.Amplitudes);
        var mesh = model.IsMomentumFree ? null : new KMesh(model.Lattice, settings.Mesh, settings.Shifted);
        bool decoupled = saddlePoint.Branch == SaddlePointBranch.Decoupled;
        var placement = Place(ham, model, mesh, saddlePoint.Mu, saddlePoint.Temperature,
                              saddlePoint.Temperature > 0 ? ChemicalPotentialRule.FermiDirac : ChemicalPotentialRule.GroundStateInBand, decoupled,
                              saddlePoint.FermiWindow, saddlePoint.FinalPass);
        return new Solution(model, ham, saddlePoint.Amplitudes, saddlePoint, mesh, placement, saddlePoint.Temperature,
                            decoupled, SolutionOrigin.Solved, null);
    }

    /// <summary>
    /// A solution file written by `solve`, with its model re-bound at the solution's parameters (plus
    /// <paramref name="extraOverrides"/>, which must not change what the solution depends on).
    /// </summary>
    /// <exception cref="InvalidDataException">Not a solution file, not converged, its model missing or changed.</exception>
    public static Solution Load(string path, IReadOnlyDictionary<string, string>? extraOverrides = null)
    {
        if (!File.Exists(path)) throw new InvalidDataException($"{path}: solution file not found");
        var doc = SolutionDocument.Load(path);
        if (!doc.Converged) throw new InvalidDataException($"{path}: the solution did not converge; it cannot be used");
        var model = doc.BindModel(path, extraOverrides);
        var amp = doc.AmplitudesFor(model, path);
        var ham = new RenormalizedHamiltonian(new BlochHamiltonian(model), amp);
        KMesh? mesh = model.IsMomentumFree || doc.Sampling.Mesh is not int n ? null : new KMesh(model.Lattice, n, doc.Sampling.Shifted ?? true);
        var rule = Enum.GetValues<ChemicalPotentialRule>().FirstOrDefault(r => SolutionDocument.RuleName(r) == doc.MuRule, ChemicalPotentialRule.FromFile);
        return new Solution(model, ham, amp, null, mesh, new(doc.Mu, rule, null), doc.Temperature,
                            doc.Branch == "decoupled", SolutionOrigin.File, path);
    }

    /// <summary>
    /// The bare model on a <paramref name="meshDivisions"/> mesh at T = 0: mu from the ordered states (the middle of a
    /// window of no states is placed at a node energy, as for solutions).
    /// </summary>
    /// <exception cref="RequestError">A momentum-free lattice, or a mesh below 2 divisions.</exception>
    public static Solution Bare(BoundModel model, int meshDivisions)
    {
        if (model.IsMomentumFree) throw new RequestError($"{model.SourcePath}: a momentum-free lattice has no bare k-resolved bands");
        if (meshDivisions < 2) throw new RequestError($"--mesh {meshDivisions}: must be at least 2 divisions");
        var ham = new BlochHamiltonian(model);
        var mesh = new KMesh(model.Lattice, meshDivisions, shifted: false);
        // One pass over the mesh gives both the ordered-state mu and the window of no states that placement refines.
        var spectrum = Analysis.Dos.MeshSpectrum.Compute(ham, mesh, withProjections: false);
        double mu = Analysis.MeshFermiLevel.Find(spectrum, model.ElectronsPerCell);
        int occ = (int)Math.Round(model.ElectronsPerCell);
        var window = occ >= 1 && occ < ham.Size ? FermiLevelPlacement.Window(spectrum, occ) : null;
        var placement = Place(ham, model, mesh, mu, 0, ChemicalPotentialRule.GroundStateInBand, decoupled: false, window);
        return new Solution(model, ham, null, null, mesh, placement, 0, false, SolutionOrigin.BareModel, null);
    }

    /// <summary>
    /// An exported one-body model as a handle: its Bloch Hamiltonian, the exported mu and temperature (nothing is
    /// re-solved or re-placed) and the exported sampling mesh, or <paramref name="meshDivisions"/> when given.
    /// </summary>
    /// <exception cref="RequestError">A mesh below 2 divisions.</exception>
    public static Solution FromExport(ExportedModel export, int? meshDivisions = null)
    {
        var model = export.Model;
        int divisions = meshDivisions ?? export.Header.Mesh ?? 16;
        if (divisions < 2) throw new RequestError($"mesh {divisions}: must be at least 2 divisions");
        var mesh = new KMesh(model.Lattice, divisions, meshDivisions is null ? export.Header.Shifted : false);
        return new Solution(model, new BlochHamiltonian(model), null, null, mesh, new(export.Header.Mu, ChemicalPotentialRule.FromFile, null),
                            export.Header.Temperature, false, SolutionOrigin.ExportedModel, model.SourcePath) { ExportHeader = export.Header };
    }

    private static FermiLevelPlacement.Placement Place(IBlochSource ham, BoundModel model, KMesh? mesh, double mu, double temperature,
                                                       ChemicalPotentialRule rule, bool decoupled, FermiWindow? window, ZonePass? pass = null)
    {
        double ne = model.ElectronsPerCell;
        int occ = (int)Math.Round(ne);
        bool whole = ne >= 1 && ne < ham.Size && Math.Abs(ne - occ) <= WholeFillingTolerance;
        if (temperature > 0 || mesh is null || decoupled || !whole) return new(mu, rule, null);
        // The window of no states: from the solver's tetrahedron filling, or from the bare model's mesh.
        return window is { Width: > 0 } w ? FermiLevelPlacement.InWindow(ham, occ, w.Lower, w.Upper, pass) : new(mu, rule, null);
    }
}
