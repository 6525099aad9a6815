using Meanfield.Analysis.Responses;
using Meanfield.Analysis.Symmetry;
using Meanfield.Lattices;
using Meanfield.Tests.Analysis;

namespace Meanfield.Tests.Analysis.Topology;

/// <summary>
/// The Berry curvature dipole is a pseudotensor (Sodemann &amp; Fu, PRL 115, 216806 (2015)): its point-group selection
/// rules and its mirror image.
/// </summary>
public sealed class CurvatureDipoleTests
{
    private static readonly ResponseMesh Mesh = new() { Divisions = 10 };
    private static readonly double[] Mu = [-1.5, -0.5, 0.5];
    private static readonly double[] T = [0.1];

    /// <summary>
    /// Selection rules (group theory, common practice; D as a pseudotensor per Sodemann &amp; Fu 2015): inversion
    /// (D_3d) forbids every component; T_d has no invariant pseudotensor of rank 2 (vector x axial vector =
    /// T2 x T1 contains no A1); C_3v about [111] allows one tensor, the antisymmetric D_ab = d eps_abc n_c with
    /// n = [111]/sqrt 3 (the polar axis), i.e. D_xy = D_yz = D_zx = -D_yx = -D_zy = -D_xz and a zero diagonal.
    /// </summary>
    [Theory]
    [InlineData(0.4, 0.0, 0)]
    [InlineData(0.0, 0.1, 0)]
    [InlineData(0.4, 0.1, 1)]
    public void AllowedComponentsFollowThePointGroup(double dt, double m, int allowed)
    {
        var ops = ModelSymmetry.Find(AnalysisModels.FuKaneMele(1, 0.125, dt, m));
        var basis = DipoleSymmetry.AllowedBasis(ops);
        Assert.Equal(allowed, basis.Count);
        if (allowed == 1)
        {
            double s = 1 / Math.Sqrt(6);
            double[] expected = [0, s, -s, -s, 0, s, s, -s, 0];
            for (int i = 0; i < 9; i++) Assert.Equal(expected[i], basis[0][i], 12);
            Assert.Equal(["xx", "yy", "zz"], DipoleSymmetry.ForbiddenComponents(ops));
        }
    }

    [Fact]
    public void ComputedDipoleOfTheC3vModelHasOnlyTheAllowedComponent()
    {
        var h = AnalysisModels.FuKaneMele(1, 0.125, 0.4, 0.1);
        var d = CurvatureDipole.Compute(h, Mu, T, Mesh);
        Assert.Equal("1", d.Unit);
        double largest = 0;
        for (int im = 0; im < Mu.Length; im++)
        {
            var x = d.Tensor[0, im];
            double norm = Math.Sqrt(x.Sum(v => v * v));
            largest = Math.Max(largest, norm);
            // D_xy = D_yz = D_zx = -D_yx ..., zero diagonal (the C3v rule above), to round-off of the symmetric mesh.
            double tol = 1e-9 * norm + 1e-15;
            Assert.Equal(x[1], x[5], tol); Assert.Equal(x[1], x[6], tol);
            Assert.Equal(-x[1], x[3], tol); Assert.Equal(-x[1], x[7], tol); Assert.Equal(-x[1], x[2], tol);
            Assert.Equal(0, x[0], tol); Assert.Equal(0, x[4], tol); Assert.Equal(0, x[8], tol);
        }
        Assert.True(largest > 1e-4, $"the dipole should not vanish for a Fermi surface without inversion (largest |D| {largest:G3})");
    }

    [Fact]
    public void InversionSymmetricModelHasNoDipole()
    {
        // Inversion maps D to -D (Sodemann & Fu 2015), so the D_3d model has D = 0 while its Fermi surface is there.
        var d = CurvatureDipole.Compute(AnalysisModels.FuKaneMele(1, 0.125, 0.4, 0), Mu, T, Mesh);
        var c3v = CurvatureDipole.Compute(AnalysisModels.FuKaneMele(1, 0.125, 0.4, 0.1), Mu, T, Mesh);
        double scale = Math.Abs(c3v.Tensor[0, 1][1]);
        foreach (var v in d.Tensor[0, 1]) Assert.Equal(0, v, 1e-9 * scale);
    }

    /// <summary>
    /// The mirror image of a model (positions reflected by M, spin treated as axial) has D' = -M D M^T, as a
    /// pseudotensor must (det M = -1; Sodemann &amp; Fu 2015). The mirror z -> -z is not a symmetry of the [111]-distorted
    /// model, so the relation is not trivially D = D'.
    /// </summary>
    [Fact]
    public void MirrorImageReversesThePseudotensor()
    {
        var h = AnalysisModels.FuKaneMele(1, 0.125, 0.4, 0.1);
        var mirror = TopologyModels.MirrorImage(h.Model, new Vec3(0, 0, 1));
        var d = CurvatureDipole.Compute(h, Mu, T, Mesh).Tensor[0, 1];
        var dm = CurvatureDipole.Compute(mirror, Mu, T, Mesh).Tensor[0, 1];
        double[] m = [1, 1, -1];
        double scale = Math.Sqrt(d.Sum(v => v * v));
        for (int a = 0; a < 3; a++)
            for (int b = 0; b < 3; b++)
                Assert.Equal(-m[a] * d[a * 3 + b] * m[b], dm[a * 3 + b], 1e-9 * scale);
        Assert.NotEqual(d[1], dm[1], 1e-6 * scale);
    }
}
