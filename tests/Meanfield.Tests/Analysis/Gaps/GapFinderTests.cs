using Meanfield.Analysis;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;

namespace Meanfield.Tests.Analysis.Gaps;

public class GapFinderTests
{
    // Invented parameters. Bands of a conduction band eps(k) and a level at 0 with hybridization V:
    // E(k) = eps/2 +- sqrt(eps^2/4 + V^2) (eigenvalues of [[eps, V], [V, 0]]; common practice).
    private const double T = 0.5, V = 0.4;

    [Fact]
    public void HybridizationGapsMatchTheClosedForm()
    {
        var src = AnalysisModels.Hybridized(T, V, 0);
        var gap = GapFinder.Find(src, new KMesh(src.Model.Lattice, 8), occupied: 2);
        // Direct gap 2V where eps = 0 (on the 8^3 mesh); indirect between the band tops at eps = +-6t.
        Assert.Equal(2 * V, gap.Direct, 12);
        Assert.Equal(2 * Math.Sqrt(9 * T * T + V * V) - 6 * T, gap.Indirect, 12);
        Assert.Equal(Math.PI, gap.ValenceMaximumAt.X, 12);   // R point: eps = +6t
        Assert.Equal(0, gap.ConductionMinimumAt.Norm, 12);    // Gamma: eps = -6t
        Assert.True(gap.IsGapped(1e-6));
    }

    [Fact]
    public void ProjectionsFollowTheHybridizedEigenvectors()
    {
        // f weight of a state at energy E: V^2 / (V^2 + E^2), from the 2x2 eigenvector with eps = E - V^2 / E
        // (common practice). Completeness: kinds integrate to 2 states each (two flavours).
        var src = AnalysisModels.Hybridized(T, V, 0);
        var dos = new TetrahedronDos(src, new KMesh(src.Model.Lattice, 20));
        var d = dos.Compute(new DosOptions { Points = 2001, Minimum = -3.5, Maximum = 3.5 });
        double cInt = 0, fInt = 0;
        for (int i = 0; i < d.Energies.Length; i++)
        {
            cInt += d.Conduction[i] * d.Step; fInt += d.Correlated[i] * d.Step;
            Assert.Equal(d.Total[i], d.Conduction[i] + d.Correlated[i], 1e-9);
            Assert.Equal(d.Total[i], d.BySite[0][i], 1e-9);
        }
        Assert.InRange(cInt, 1.99, 2.01);
        Assert.InRange(fInt, 1.99, 2.01);
        Assert.Equal(4.0, d.Integrated[^1], 10);
        foreach (double e in new[] { -1.5, -0.8, 0.6, 1.2 })
        {
            var at = dos.DosAtEnergy(e);
            double exact = V * V / (V * V + e * e);
            Assert.InRange(at.Correlated / at.Total, exact * 0.97, exact * 1.03);   // linear weights inside tetrahedra
        }
        Assert.Equal(0.0, dos.DosAtEnergy(0).Total);   // inside the indirect gap
    }

    [Fact]
    public void ClassifierLabelsInsulatorMetalWeylDiracAndDecoupled()
    {
        var ins = AnalysisModels.Hybridized(T, V, 0);
        var insGap = GapFinder.Find(ins, new KMesh(ins.Model.Lattice, 8), 2);
        Assert.Equal(Phase.Decoupled, PhaseClassifier.Classify(true, true, insGap, NodeSearch.Find(ins, 2, 0, new NodeSearchOptions { Mesh = 8 })).Phase);
        Assert.Equal(Phase.KondoInsulator, PhaseClassifier.Classify(false, true, insGap, NodeSearch.Find(ins, 2, 0, new NodeSearchOptions { Mesh = 8 })).Phase);

        // Half-filled single band: a Fermi surface.
        var hyb = AnalysisModels.Hybridized(T, V, 0);
        var metalNodes = NodeSearch.Find(hyb, 1, 0, new NodeSearchOptions { Mesh = 8 });   // mu in the lower pair
        var metalGap = GapFinder.Find(hyb, new KMesh(hyb.Model.Lattice, 8), 1);
        Assert.True(metalNodes.FermiSurfaceAwayFromNodes);
        Assert.Equal(Phase.HeavyMetal, PhaseClassifier.Classify(false, true, metalGap, metalNodes).Phase);

        var weyl = AnalysisModels.LatticeWeyl(0.7, 1.2, 2.0);
        var weylGap = GapFinder.Find(weyl, new KMesh(weyl.Model.Lattice, 10), 1);
        Assert.Equal(Phase.WeylSemimetal, PhaseClassifier.Classify(false, true, weylGap, NodeSearch.Find(weyl, 1, 0, new NodeSearchOptions { Mesh = 10 })).Phase);

        var fkm = AnalysisModels.FuKaneMele(1.0, 0.1);
        var fkmGap = GapFinder.Find(fkm, new KMesh(fkm.Model.Lattice, 12), 2);
        var fkmNodes = NodeSearch.Find(fkm, 2, 0, new NodeSearchOptions { Mesh = 12 });
        Assert.Equal(Phase.DiracSemimetal, PhaseClassifier.Classify(false, true, fkmGap, fkmNodes).Phase);
    }
}
