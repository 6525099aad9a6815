using System.CommandLine;
using System.Globalization;
using Meanfield.Analysis.Topology;
using Meanfield.Output;
using Meanfield.Output.Topology;
using Meanfield.Units;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield invariants INPUT [--flow FILE.png]`: Z2 indices (or a 2D Chern number) of the occupied bands.</summary>
public static class InvariantsCommand
{
    /// <summary>Builds the `invariants` command.</summary>
    public static Command Build()
    {
        var solution = new SolutionOptions();
        var flow = new Option<string?>("--flow") { Description = "Write the Wannier-centre flow as a picture (.png, .svg or .pdf) and a CSV table next to it" };
        var gapMesh = new Option<int>("--gap-mesh") { Description = "Mesh of the gap check (node search), 4..96", DefaultValueFactory = _ => 12 };
        var loops = new Option<int>("--loop-points") { Description = "k-points per Wilson loop, 8..512 (doubled where links are too small)", DefaultValueFactory = _ => 32 };
        var command = new Command("invariants", "Topological invariants of the filled bands: Z2 by parities and Wannier-centre flow, Chern number in 2D; exit 4 when there is no gap")
            { flow, gapMesh, loops };
        solution.AddTo(command);
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var err = parse.InvocationConfiguration.Error;
            var flowPath = parse.GetValue(flow);
            if (flowPath is not null) PlotStyle.CheckPictureName(flowPath, "--flow");
            int gm = parse.GetValue(gapMesh), lp = parse.GetValue(loops);
            if (gm is < 4 or > 96) throw new UserInputException($"--gap-mesh {gm}: use 4..96");
            if (lp is < 8 or > 512) throw new UserInputException($"--loop-points {lp}: use 8..512");
            var src = solution.Resolve(parse, o);
            if (src.Model.IsMomentumFree) throw new UserInputException($"{src.Model.SourcePath}: a momentum-free lattice has no band topology");
            int occ = NodesCommand.OccupiedBands(src);

            var r = InvariantReport.Compute(src.Hamiltonian, occ, new Z2Options { GapMesh = gm, LoopPoints = lp });

            var inv = CultureInfo.InvariantCulture;
            var z = r.Z2;
            o.WriteLine($"{src.Model.Name}: {occ} filled bands of {src.Hamiltonian.Size}; {r.Dimension}D");
            if (z.Gap is { } g)
                o.WriteLine(string.Create(inv, $"gap check (mesh {g.Mesh}): {g.Nodes} touching(s), smallest direct gap {g.MinimumDirectGap:G4}, indirect gap {g.IndirectGap:G4} {src.Model.Unit.Symbol()}"));
            o.WriteLine($"Z2: {z.Status.ToString().ToLowerInvariant()} ({z.Reason})");
            if (z.Inversion is { } i)
            {
                o.WriteLine($"  parity formula (inversion centre {i.Centre} angstrom): {z.FromParity?.ToString() ?? "unresolved"}");
                o.WriteLine("  TRIM (n1 n2 n3)  odd states  delta");
                foreach (var t in z.Trims)
                    o.WriteLine($"  ({t.Index.N1} {t.Index.N2} {t.Index.N3})          {t.OddStates,3}     {t.Delta,3:+0;-0}{(t.Resolved ? "" : "  unresolved")}");
            }
            if (z.Flows.Count > 0)
                o.WriteLine($"  Wannier-centre flow: {z.FromFlow?.ToString() ?? "unresolved"}; plane Z2 = " + string.Join(" ", z.Flows.Select(f => f.Z2)));
            if (z.Indices is { } x) o.WriteLine($"  indices {x} -> {x.Class.ToString().ToLowerInvariant()}{(r.Dimension == 2 && x.Nu0 == 1 ? " (quantum spin Hall)" : "")}");
            if (r.Chern is { } c)
                o.WriteLine(string.Create(inv, $"Chern number: {(c.Chern?.ToString(inv) ?? "none")} ({c.Status.ToString().ToLowerInvariant()}: {c.Reason}; {c.Grid}x{c.Grid} plaquettes)"));
            if (flowPath is not null && z.Flows.Count > 0)
            {
                var table = Path.ChangeExtension(flowPath, ".csv");
                WannierFlowPlot.Save(z.Flows, flowPath, $"{src.Model.Name}: Wannier-centre flow, {occ} bands");
                WannierFlowPlot.WriteTable(z.Flows, table, new Dictionary<string, string>
                    { ["model"] = src.Model.Name, ["source"] = ResultProvenance.SourceFile(src), ["source_kind"] = src.OriginText, ["model_sha256"] = Provenance.Hash(src.Model.SourceText), ["tool_version"] = Provenance.ToolVersion });
                o.WriteLine($"wrote {flowPath} and {table}");
            }
            if (r.Status == InvariantStatus.Determined) return ExitCodes.Success;
            err.WriteLine($"no invariant: {(r.Chern is { Status: not InvariantStatus.Determined } ch ? ch.Reason : z.Reason)}");
            return ExitCodes.NoAnswer;
        });
        return command;
    }
}
