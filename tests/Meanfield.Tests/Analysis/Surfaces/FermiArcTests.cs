using Meanfield.Analysis.Surfaces;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Solutions;
using Meanfield.Solver;

namespace Meanfield.Tests.Analysis.Surfaces;

/// <summary>
/// Bulk-boundary correspondence counted from the semi-infinite crystal (Wan, Turner, Vishwanath &amp; Savrasov, PRB 83,
/// 205101 (2011)): on a loop around a projected node along which the bulk is gapped at the node energy, the net number
/// of surface states crossing it equals the net chirality projected inside; Fermi arcs join projections of opposite
/// chirality. The chiralities are the bulk Berry fluxes (an independent computation); they sum to zero over the zone
/// (Nielsen &amp; Ninomiya, Nucl. Phys. B 185, 20 (1981)).
/// </summary>
public sealed class FermiArcTests
{
    private const double K0 = Math.PI / 2;

    [Fact]
    public void Shipped_Weyl_solution_loop_counts_equal_the_projected_chirality_and_arcs_join_opposite_chiralities()
    {
        // The shipped Orvathite model at T = 0 on a small mesh: mu sits at the heavy Weyl nodes (~1e-3 of the bandwidth).
        var path = Path.Combine(Meanfield.Tests.Models.ModelText.RepositoryRoot(), "models", "weyl-diamond.toml");
        var model = ModelBinder.Bind(ModelFile.Load(path), new Dictionary<string, string>());
        var settings = new SolverSettings { Temperature = 0, Mesh = 8, Shifted = true };
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        var solution = Solution.FromSaddlePoint(model, sp, settings);
        var report = SurfaceStudy.Run(solution, new SurfaceRequest { Plane = "0,0,1", View = SurfaceView.Arcs, Grid = 2 });
        Assert.Equal(solution.Mu, report.ChemicalPotential);
        var nodes = report.Nodes;
        Assert.NotEmpty(nodes);
        Assert.All(nodes, n => Assert.Equal(0, n.Undetermined));
        Assert.Equal(0, nodes.Sum(n => n.Chirality));
        Assert.Contains(nodes, n => n.Chirality != 0);
        Assert.Equal(nodes.Count, report.Loops.Count);
        foreach (var loop in report.Loops)
        {
            var node = nodes[loop.Node];
            string where = $"node ({node.S1:F3}, {node.S2:F3}) chirality {node.Chirality}: {loop.Verdict}, {loop.Up} up, {loop.Down} down, clearance {loop.Clearance:G3}";
            Assert.True(loop.Verdict == LoopVerdict.Decided, where);
            Assert.True(node.Chirality == loop.Net, where);
            // The bulk is gapped on the loop by at least the named fraction of the heavy-band scale.
            Assert.True(loop.Clearance >= SurfaceTolerances.MinClearanceFraction * report.Scale, where);
        }
        // Every +-1 projection ends exactly |chirality| arcs, each joining opposite chiralities.
        Assert.All(report.Arcs, a => Assert.Null(a.Unresolved));
        Assert.All(report.Arcs, a => Assert.Equal(-nodes[a.From].Chirality, nodes[a.To!.Value].Chirality));
        for (int i = 0; i < nodes.Count; i++)
            Assert.Equal(Math.Abs(nodes[i].Chirality), report.Arcs.Count(a => a.From == i || a.To == i));
    }

    [Fact]
    public void Lattice_Weyl_arc_runs_at_ky_zero_beyond_the_nodes()
    {
        // t [sin kx sx + sin ky sy + (cos kz - cos k0 + 2 - cos kx - cos ky) sz] on its (100) face: the top-face arc at
        // E = 0 is ky = 0 with |kz| > k0 (derived in BulkBoundaryTests), joining the nodes through kz = pi.
        var bulk = SurfaceModels.Weyl(1, K0);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 1, 0, 0));
        var (nodes, note) = ProjectedNodes.Find(bulk, cut.Zone, 0.0, 8);
        Assert.Null(note);
        double scale = LowEnergyScale.Width(bulk, 0.0);
        var loops = Enumerable.Range(0, nodes.Count).Select(i => SurfaceLoops.Around(cut, nodes, i, 0.0, scale)).ToList();
        Assert.All(loops, l => Assert.Equal(LoopVerdict.Decided, l.Verdict));
        Assert.All(loops, l => Assert.Equal(nodes[l.Node].Chirality, l.Net));
        var arcs = FermiArcs.Trace(cut, nodes, loops, scale);
        var arc = Assert.Single(arcs);
        Assert.True(arc.BothEnds);
        Assert.Equal(-nodes[arc.From].Chirality, nodes[arc.To!.Value].Chirality);
        foreach (var (s1, s2) in arc.Points.Skip(1).SkipLast(1))
        {
            var k = cut.Zone.FromMap(s1, s2);
            Assert.InRange(k.Y, -1e-3, 1e-3);
            Assert.True(Math.Abs(k.Z) > K0 - 1e-3, $"arc point kz = {k.Z}");
        }
    }

    [Fact]
    public void A_loop_through_another_projected_node_cannot_be_decided()
    {
        // The bulk is gapless where a node projects (common practice): a loop through it must give no count.
        var bulk = SurfaceModels.Weyl(1, K0);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 1, 0, 0));
        var (nodes, _) = ProjectedNodes.Find(bulk, cut.Zone, 0.0, 8);
        double scale = LowEnergyScale.Width(bulk, 0.0);
        double separation = (nodes[1].KPar - nodes[0].KPar).Norm;
        var c = SurfaceLoops.OnCircle(cut, nodes[0].KPar, separation, 0.0, scale);
        Assert.Equal(LoopVerdict.BulkGapless, c.Verdict);
        Assert.Equal(0, c.Net);
    }

    [Fact]
    public void A_loop_inside_the_projected_bulk_pocket_cannot_be_decided_and_one_outside_counts_the_chirality()
    {
        // Near the node the lattice model is the cone E = t|q| (velocity t a, common practice), so at E = 0.1 t the bulk
        // pocket projects onto a disk of radius about 0.1 / a: a loop inside it meets bulk states at E, one well outside
        // is gapped and still counts the chirality (Wan et al. 2011: any energy gapped on the loop).
        var bulk = SurfaceModels.Weyl(1, K0);
        var cut = new SurfaceCut(bulk.Model, LatticePlane.FromIndices(bulk.Model.Lattice, 1, 0, 0));
        var (nodes, _) = ProjectedNodes.Find(bulk, cut.Zone, 0.0, 8);
        double scale = LowEnergyScale.Width(bulk, 0.0);
        var inside = SurfaceLoops.OnCircle(cut, nodes[0].KPar, 0.05, 0.1, scale);
        Assert.Equal(LoopVerdict.BulkGapless, inside.Verdict);
        var outside = SurfaceLoops.OnCircle(cut, nodes[0].KPar, 0.4, 0.1, scale);
        Assert.Equal(LoopVerdict.Decided, outside.Verdict);
        Assert.Equal(nodes[0].Chirality, outside.Net);
    }
}
