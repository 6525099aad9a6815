using System.CommandLine;
using System.Globalization;
using System.Text;
using Meanfield.Analysis;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Output;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield nodes INPUT --out nodes.json`: Weyl and Dirac nodes at the Fermi level, gaps and the phase label.</summary>
public static class NodesCommand
{
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var output = CommonOptions.Out();
        var searchMesh = SearchMesh(16);
        var command = new Command("nodes", "Band touchings (Weyl and Dirac nodes) between the highest occupied and lowest empty band, as JSON")
            { output, searchMesh };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var err = parse.InvocationConfiguration.Error;
            var outPath = parse.GetValue(output)!;
            if (!outPath.EndsWith(".json", StringComparison.OrdinalIgnoreCase)) throw new UserInputException($"--out {outPath}: use a .json file name");
            int sm = CheckSearchMesh(parse.GetValue(searchMesh));
            var inputPath = parse.GetValue(solution.Input)!;
            CommonOptions.RefuseOverwrite(inputPath, [outPath]);
            var src = solution.Resolve(parse, o);
            if (!IsWholeFilling(src.Model))
            {
                err.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"{src.Model.Name} is a metal: {src.Model.ElectronsPerCell:G6} electrons per cell fill a band partly, so there is a Fermi surface and no nodes to report. {outPath} was not written."));
                return ExitCodes.NoAnswer;
            }
            var a = Analyse(src, inputPath, sm);
            if (a.Nodes.IsMetal)
            {
                err.WriteLine($"{src.Model.Name} is a metal: bands {a.Nodes.OccupiedBands - 1} and {a.Nodes.OccupiedBands} (0-based) are not separated at the chemical potential "
                              + string.Create(CultureInfo.InvariantCulture, $"(overlap {a.Nodes.BandOverlap:G4} {src.Model.Unit.Symbol()}), so there is a Fermi surface and no nodes to report. {outPath} was not written."));
                return ExitCodes.NoAnswer;
            }
            var prov = new Dictionary<string, string>
            {
                ["model"] = src.Model.Name, ["source"] = src.Origin, ["model_sha256"] = Provenance.Hash(src.Model.SourceText),
                ["tool_version"] = Provenance.ToolVersion,
                ["mu_origin"] = src.Mu is null ? "bare model: node energy, or mid-gap on the mesh" : "solution",
            };
            var json = NodeReportJson.Build(a.Nodes, a.Gaps, a.DosFermi, src.Model.FormulaUnitsPerCell, a.Phase, src.Model.Lattice, src.Model.Unit, prov);
            AtomicFile.WriteText(outPath, json + "\n");
            o.Write(Table(a, src.Model));
            foreach (var w in a.Nodes.Warnings) err.WriteLine($"warning: {w}");
            o.WriteLine($"wrote {outPath}");
            return ExitCodes.Success;
        });
        return command;
    }

    internal static Option<int> SearchMesh(int fallback) =>
        new("--search-mesh") { Description = $"Coarse k-mesh of the node search (Gamma-centred; default {fallback})", DefaultValueFactory = _ => fallback };

    internal static int CheckSearchMesh(int n) =>
        n is >= 4 and <= 96 ? n : throw new UserInputException($"--search-mesh {n}: use 4..96 divisions");

    /// <summary>Everything `nodes` reports, before it is written.</summary>
    internal sealed record Analysis(NodeSearchResult Nodes, GapReport Gaps, DosValue DosFermi, PhaseLabel Phase);

    /// <summary>n_occ from the electron count (an integer or an error), mu, the node search, gaps, DOS and label.</summary>
    internal static Analysis Analyse(SolutionInput src, string inputPath, int searchMesh)
    {
        var model = src.Model;
        int occ = OccupiedBands(model, src.Hamiltonian.Size);
        if (model.IsMomentumFree) throw new UserInputException($"{model.SourcePath}: a momentum-free lattice has no k-space nodes");
        var kmesh = new KMesh(model.Lattice, searchMesh);
        var tetra = new TetrahedronDos(src.Hamiltonian, kmesh);
        var gaps = GapFinder.Find(tetra.Spectrum, occ);
        double mu = src.Mu ?? MeshFermiLevel.Find(tetra.Spectrum, model.ElectronsPerCell);
        var (lo, hi) = tetra.Spectrum.Range();
        double width = Math.Max(hi - lo, 1e-300);
        var options = new NodeSearchOptions { Mesh = searchMesh };
        var nodes = NodeSearch.Find(src.Hamiltonian, occ, mu, options);
        if (src.Mu is null && nodes.Nodes.Count > 0 && nodes.BandOverlap <= 1e-6 * width)
        {
            // A bare semimetal's T = 0 chemical potential sits at its nodes when they share one energy.
            var energies = nodes.Nodes.Select(n => n.EnergyOffset + mu).ToList();
            if (energies.Max() - energies.Min() < 1e-6 * width)
            {
                mu = energies.Average();
                nodes = NodeSearch.Find(src.Hamiltonian, occ, mu, options);
            }
        }
        var dos = tetra.DosAtEnergy(mu);
        var (decoupled, temperature) = SolutionFacts(src, inputPath);
        var phase = PhaseClassifier.Classify(decoupled, gaps, nodes, dos.Total, SpectrumSummary.Tolerances(width, temperature));
        return new(nodes, gaps, dos, phase);
    }

    /// <summary>A whole number of electrons per cell: the only fillings that can leave a gap or pin mu at nodes.</summary>
    internal static bool IsWholeFilling(BoundModel model) => Math.Abs(model.ElectronsPerCell - Math.Round(model.ElectronsPerCell)) <= 1e-9;

    internal static int OccupiedBands(BoundModel model, int size)
    {
        double ne = model.ElectronsPerCell;
        int occ = (int)Math.Round(ne);
        if (Math.Abs(ne - occ) > 1e-9)
            throw new UserInputException($"{model.SourcePath}: electrons_per_cell = {ne.ToString("G6", CultureInfo.InvariantCulture)} is not an integer; nodes need a whole number of filled bands");
        if (occ < 1 || occ >= size)
            throw new UserInputException($"{model.SourcePath}: electrons_per_cell = {occ} leaves no empty or no filled band ({size} bands)");
        return occ;
    }

    // Branch and temperature (energy unit) of the solution behind the input; a bare model is neither decoupled nor warm.
    private static (bool Decoupled, double Temperature) SolutionFacts(SolutionInput src, string inputPath)
    {
        if (src.Solution is { } sp) return (sp.Branch == Solver.SaddlePointBranch.Decoupled, sp.Temperature);
        if (src.Mu is not null && inputPath.EndsWith(".json", StringComparison.OrdinalIgnoreCase))
        {
            var doc = SolutionDocument.Load(inputPath);
            return (doc.Branch == "decoupled", doc.Temperature);
        }
        return (false, 0);
    }

    private static string Table(Analysis a, BoundModel model)
    {
        var inv = CultureInfo.InvariantCulture;
        var u = model.Unit.Symbol();
        var sb = new StringBuilder();
        sb.AppendLine(string.Create(inv, $"mu = {a.Nodes.ChemicalPotential:G8} {u}; occupied bands {a.Nodes.OccupiedBands}; search mesh {a.Nodes.Mesh}"));
        sb.AppendLine(string.Create(inv, $"gaps: direct {a.Gaps.Direct:G5} {u}, indirect {a.Gaps.Indirect:G5} {u} (mesh {a.Gaps.Mesh})"));
        sb.AppendLine(string.Create(inv, $"DOS at mu: total {a.DosFermi.Total:G5}, correlated {a.DosFermi.Correlated:G5} states/{u} per cell"));
        sb.AppendLine($"{a.Nodes.Nodes.Count} node(s); chirality sum {a.Nodes.ChiralitySum}");
        if (a.Nodes.Nodes.Count > 0)
        {
            sb.AppendLine($"{"#",3} {"reduced position",-30} {"where",-12} {"E-mu (" + u + ")",12} {"chir",5} {"flux/2pi",9} {"kind",6} {"|det v|",10} {"tilt",6} {"type",4}");
            int i = 0;
            foreach (var n in a.Nodes.Nodes)
                sb.AppendLine(string.Create(inv,
                    $"{i++,3} {$"({n.Reduced.X:F4}, {n.Reduced.Y:F4}, {n.Reduced.Z:F4})",-30} {n.Location ?? "-",-12} {n.EnergyOffset,12:G4} {n.Chirality,5:+0;-0;0} {n.FluxOver2Pi,9:F3} {(n.IsDirac ? "Dirac" : "Weyl"),6} {n.DetVelocity,10:G4} {n.TiltRatio,6:F3} {(n.Type == NodeType.TypeI ? "I" : "II"),4}"));
        }
        sb.AppendLine($"phase: {SpectrumSummary.Name(a.Phase.Phase)} ({a.Phase.Reason})");
        return sb.ToString();
    }
}
