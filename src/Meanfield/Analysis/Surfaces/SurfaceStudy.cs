using System.Globalization;
using Meanfield.Bloch;
using Meanfield.Renormalization;
using Meanfield.Solutions;
using Meanfield.Units;

namespace Meanfield.Analysis.Surfaces;

/// <summary>What a surface study computes: slab bands, A_s along a path, or the A_s map at mu (Fermi arcs).</summary>
public enum SurfaceView { Slab, Spectrum, Arcs }

/// <summary>The questions of one surface study; defaults in brackets. Energies in the model's unit.</summary>
public sealed record SurfaceRequest
{
    /// <summary>Miller indices "h,k,l" (conventional cell of the cubic kinds; reduced for explicit lattices).</summary>
    public required string Plane { get; init; }
    /// <summary>Outermost site of the top face [the first site].</summary>
    public string? Termination { get; init; }
    public SurfaceView View { get; init; } = SurfaceView.Slab;
    /// <summary>Principal layers of the slab [16]; at least 2.</summary>
    public int Layers { get; init; } = 16;
    /// <summary>Extra potential on the outermost layers [none]; on the slab's bottom face too when <see cref="SkinOnBothFaces"/>.</summary>
    public SkinPotential? Skin { get; init; }
    public bool SkinOnBothFaces { get; init; }
    /// <summary>Broadening [<see cref="LowEnergyScale.DefaultEtaFraction"/> x the low-energy scale]; positive.</summary>
    public double? Eta { get; init; }
    /// <summary>Surface-zone path ["auto": the standard path of the surface lattice].</summary>
    public string? Path { get; init; }
    /// <summary>k-points along the path [240].</summary>
    public int Points { get; init; } = 240;
    /// <summary>Energies of the path spectrum [200], 2..5000.</summary>
    public int Energies { get; init; } = 200;
    /// <summary>Energy window relative to mu [+-<see cref="WindowFraction"/> x the low-energy scale].</summary>
    public (double Low, double High)? Window { get; init; }
    /// <summary>Points per side of the arc map [200], 2..2000.</summary>
    public int Grid { get; init; } = 200;
    /// <summary>Coarse mesh of the bulk node search [16].</summary>
    public int NodeMesh { get; init; } = 16;

    /// <summary>Default half-width of the energy window, as a fraction of the low-energy scale.</summary>
    public const double WindowFraction = 0.1;
}

/// <summary>The result of <see cref="SurfaceStudy.Run"/>: one of the three views with everything needed to label it.</summary>
public sealed class SurfaceReport
{
    public required SurfaceCut Cut { get; init; }
    public required SurfaceRequest Request { get; init; }
    public required double ChemicalPotential { get; init; }
    /// <summary>Where mu comes from: "solution (RULE)".</summary>
    public required string ChemicalPotentialOrigin { get; init; }
    public required double Scale { get; init; }
    public required double Eta { get; init; }
    public required (double Low, double High) Window { get; init; }
    /// <summary>Which Hamiltonian the slab is built from (renormalized from the bulk saddle point, or bare).</summary>
    public required string Hamiltonian { get; init; }
    public SlabBands? Slab { get; init; }
    public SurfacePathSpectrum? Spectrum { get; init; }
    public SurfaceMap? Map { get; init; }
    public IReadOnlyList<ProjectedNode> Nodes { get; init; } = [];
    /// <summary>Arcs view: the loop count at mu around each projected node (same order as <see cref="Nodes"/>).</summary>
    public IReadOnlyList<LoopCount> Loops { get; init; } = [];
    /// <summary>Arcs view: the traced Fermi arcs and the projected nodes each joins.</summary>
    public IReadOnlyList<FermiArc> Arcs { get; init; } = [];
    /// <summary>Plain-language notes (no node search, points that did not converge, ...).</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];
    /// <summary>Decimation points that did not converge (0 for the slab view).</summary>
    public int NotConverged => Spectrum?.NotConverged ?? Map?.NotConverged ?? 0;
}

/// <summary>
/// One entry point for a surface: cuts the bulk Hamiltonian along the requested plane and computes the requested view.
/// A mean-field source is used through its renormalized one-body model: the slab and the semi-infinite crystal carry
/// the bulk saddle point (static r and lambda of the bulk solution), not a layer-resolved self-consistent one.
/// </summary>
public static class SurfaceStudy
{
    /// <summary>
    /// Runs the requested view on the solution's Hamiltonian at the solution's chemical potential. The arcs view also
    /// counts surface states around every projected node (<see cref="SurfaceLoops"/>) and traces the arcs
    /// (<see cref="FermiArcs"/>).
    /// </summary>
    /// <exception cref="RequestError">Bad plane, unknown termination, 2D or momentum-free model, fewer than 2
    /// layers, a bad path, non-positive eta, an empty window or out-of-range counts. Nothing is computed then.</exception>
    public static SurfaceReport Run(Solution solution, SurfaceRequest request)
    {
        var source = solution.Hamiltonian;
        var model = source.Model;
        var plane = LatticePlane.Parse(request.Plane, model.Lattice);
        var bonds = SurfaceCut.BondsOf(source);
        var cut = new SurfaceCut(bonds, plane, request.Termination);
        var slab = new Slab(cut, request.Layers, request.Skin, request.SkinOnBothFaces);
        if (request.Energies is < 2 or > 5000) throw new RequestError($"--energies {request.Energies}: use 2..5000");
        if (request.Grid is < 2 or > 2000) throw new RequestError($"--grid {request.Grid}: use 2..2000 points per side");
        if (request.Eta is { } e && !(e > 0 && double.IsFinite(e))) throw new RequestError($"--eta {e}: must be a positive number");
        if (request.Window is { } w && !(w.High > w.Low)) throw new RequestError($"--window {w.Low} {w.High}: the upper end must exceed the lower");
        var path = request.View == SurfaceView.Arcs ? null : cut.Zone.Path(request.Path).Sample(request.Points);

        double mu = solution.Mu;
        double scale = LowEnergyScale.Width(source, mu);
        double eta = request.Eta ?? LowEnergyScale.DefaultEtaFraction * scale;
        var window = request.Window ?? (-SurfaceRequest.WindowFraction * scale, SurfaceRequest.WindowFraction * scale);
        var notes = new List<string>();
        IReadOnlyList<ProjectedNode> nodes = [];
        if (request.View != SurfaceView.Slab)
        {
            var (found, note) = ProjectedNodes.Find(source, cut.Zone, mu, request.NodeMesh);
            nodes = found;
            if (note is not null) notes.Add(note);
        }
        IReadOnlyList<LoopCount> loops = [];
        IReadOnlyList<FermiArc> arcs = [];
        if (request.View == SurfaceView.Arcs && nodes.Count > 0)
        {
            var counts = new LoopCount[nodes.Count];
            Parallel.For(0, nodes.Count, i => counts[i] = SurfaceLoops.Around(cut, nodes, i, mu, scale));
            loops = counts;
            arcs = FermiArcs.Trace(cut, nodes, loops, scale);
            int undecided = counts.Count(c => c.Verdict != LoopVerdict.Decided);
            if (undecided > 0) notes.Add($"{undecided} loop count(s) cannot be decided: the bulk is gapless at mu on every loop tried");
        }
        SlabBands? bands = null; SurfacePathSpectrum? spectrum = null; SurfaceMap? map = null;
        switch (request.View)
        {
            case SurfaceView.Slab:
                bands = SlabBands.Compute(slab, path!);
                break;
            case SurfaceView.Spectrum:
                var energies = new double[request.Energies];
                for (int i = 0; i < energies.Length; i++) energies[i] = mu + window.Low + (window.High - window.Low) * i / (energies.Length - 1);
                spectrum = SurfaceSpectra.AlongPath(cut, path!, energies, eta, request.Skin);
                break;
            default:
                map = SurfaceSpectra.Map(cut, mu, eta, request.Grid, request.Grid, request.Skin);
                break;
        }
        int failed = spectrum?.NotConverged ?? map?.NotConverged ?? 0;
        if (failed > 0) notes.Add($"{failed} (k, E) point(s) did not converge in {Decimation.MaxSteps} decimation steps (flagged; try a larger --eta)");
        if (request.Skin is not null && request.SkinOnBothFaces && request.View != SurfaceView.Slab)
            notes.Add("the semi-infinite crystal has one face: the surface potential acts on the top face only");
        return new SurfaceReport
        {
            Cut = cut, Request = request, ChemicalPotential = mu,
            ChemicalPotentialOrigin = $"{solution.OriginText} ({Output.SolutionDocument.RuleName(solution.MuRule)})",
            Scale = scale, Eta = eta, Window = window, Hamiltonian = Describe(source),
            Slab = bands, Spectrum = spectrum, Map = map, Nodes = nodes, Loops = loops, Arcs = arcs, Notes = notes,
        };
    }

    /// <summary>Which Hamiltonian a source is, in words (for outputs).</summary>
    public static string Describe(IBlochSource source) => source is RenormalizedHamiltonian
        ? "renormalized Hamiltonian of the bulk saddle point (static r and lambda of the bulk solution; no layer-resolved self-consistency)"
        : "bare model (no mean-field renormalization)";

    /// <summary>
    /// Plain-text lines on the loop counts (one per projected node: loop, bulk clearance, signed crossings against the
    /// projected chirality, or why it cannot be decided) and on the arcs (which projected nodes each joins).
    /// </summary>
    public static IEnumerable<string> TopologyLines(SurfaceReport r)
    {
        var inv = CultureInfo.InvariantCulture;
        string u = r.Cut.Model.Unit.Symbol();
        string At(int i) => string.Create(inv, $"({r.Nodes[i].S1:F4}, {r.Nodes[i].S2:F4}) [{r.Nodes[i].Chirality:+0;-0;0}]");
        foreach (var l in r.Loops)
        {
            var n = r.Nodes[l.Node];
            string head = string.Create(inv, $"loop at mu around {At(l.Node)}, radius {l.Radius:G3} 1/angstrom, bulk clearance {l.Clearance:G3} {u}");
            if (l.Verdict != LoopVerdict.Decided) { yield return $"{head}: cannot be decided ({(l.Verdict == LoopVerdict.BulkGapless ? "bulk states at mu on every loop tried" : "decimation did not converge")})"; continue; }
            string expected = n.Undetermined > 0 ? $"{n.Undetermined} chirality undetermined" : n.Chirality == l.Net ? "= net chirality" : $"differs from net chirality {n.Chirality:+0;-0;0}";
            yield return string.Create(inv, $"{head}: {l.Up} up, {l.Down} down, net {l.Net:+0;-0;0} {expected}");
        }
        foreach (var a in r.Arcs)
            yield return a.To is int to
                ? $"Fermi arc joins {At(a.From)} and {At(to)}{(a.BothEnds ? " (traced from both ends)" : "")}"
                : $"Fermi arc from {At(a.From)}: unresolved, {a.Unresolved}";
    }

    /// <summary>Key facts of a report as text pairs, for file headers and metadata.</summary>
    public static IReadOnlyList<KeyValuePair<string, string>> Facts(SurfaceReport r)
    {
        var inv = CultureInfo.InvariantCulture;
        var c = r.Cut;
        var list = new List<KeyValuePair<string, string>>
        {
            new("model", c.Model.Name), new("hamiltonian", r.Hamiltonian),
            new("plane", c.Plane.ToString()), new("normal", c.Plane.Normal.ToString()),
            new("plane_spacing_angstrom", c.Plane.Spacing.ToString("G8", inv)),
            new("surface_lattice", c.Zone.Type.ToString().ToLowerInvariant()),
            new("termination", c.Model.Sites[c.Termination].Name), new("top_plane_sites", string.Join(" ", c.TopSites)),
            new("elementary_layers_per_principal_layer", c.ElementaryLayers.ToString(inv)),
            new("energy_unit", c.Model.Unit.Symbol()), new("k_unit", "1/angstrom"),
            new("chemical_potential", r.ChemicalPotential.ToString("R", inv)), new("chemical_potential_origin", r.ChemicalPotentialOrigin),
            new("low_energy_scale", r.Scale.ToString("G6", inv)),
        };
        if (r.Request.View == SurfaceView.Slab)
        {
            list.Add(new("layers", r.Request.Layers.ToString(inv)));
            list.Add(new("face_depth_layers", r.Slab!.FaceDepth.ToString(inv)));
        }
        else
        {
            list.Add(new("eta", r.Eta.ToString("G6", inv)));
            list.Add(new("surface", "semi-infinite crystal below the top face (Lopez Sancho, Lopez Sancho & Rubio decimation); spectral functions per energy unit per surface cell and principal layer"));
            list.Add(new("not_converged_points", r.NotConverged.ToString(inv)));
            list.Add(new("projected_nodes", string.Join(";", r.Nodes.Select(n => string.Create(inv, $"{n.S1:G6},{n.S2:G6},{n.Chirality:+0;-0;0}")))));
        }
        if (r.Loops.Count > 0)
        {
            list.Add(new("loop_counts", System.Text.Json.JsonSerializer.Serialize(r.Loops.Select(l => new
            {
                node = new[] { r.Nodes[l.Node].S1, r.Nodes[l.Node].S2 }, chirality = r.Nodes[l.Node].Chirality,
                nodes = r.Nodes[l.Node].Count, undetermined = r.Nodes[l.Node].Undetermined,
                verdict = l.Verdict.ToString().ToLowerInvariant(), radius = l.Radius, clearance = l.Clearance, eta = l.Eta,
                up = l.Up, down = l.Down, net = l.Net,
            }))));
            list.Add(new("fermi_arcs", System.Text.Json.JsonSerializer.Serialize(r.Arcs.Select(a => new
            {
                from = new[] { r.Nodes[a.From].S1, r.Nodes[a.From].S2 }, from_chirality = r.Nodes[a.From].Chirality,
                to = a.To is int t ? new[] { r.Nodes[t].S1, r.Nodes[t].S2 } : null, to_chirality = a.To is int u ? r.Nodes[u].Chirality : (int?)null,
                both_ends = a.BothEnds, unresolved = a.Unresolved,
            }))));
        }
        if (r.Request.Skin is { } s)
            list.Add(new("surface_potential", string.Create(inv, $"{s.Shift:G6} on {s.Depth} elementary layer(s){(r.Request.SkinOnBothFaces && r.Request.View == SurfaceView.Slab ? ", both faces" : ", top face")}")));
        foreach (var note in r.Notes) list.Add(new("note", note));
        return list;
    }
}
