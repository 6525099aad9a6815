using MathNet.Numerics.Integration;
using MathNet.Numerics.LinearAlgebra;
using Meanfield.Analysis.Dos;
using Meanfield.Heat;

namespace Meanfield.Tests.Heat;

/// <summary>
/// The DOS of a tilted cone, derived here. For H = E0 + v0.q + sum_ij q_i v_ij sigma_j, p = v^T q turns the cone into
/// E = E0 + w.p +- |p| with w = v^-1 v0. For |w| &lt; 1 the upper cone below E0 + eps fills |p| &lt; eps/(1 + |w| cos theta),
/// so it holds N(eps) = (1/(2 pi)^3) Int dOmega eps^3/(3 (1 + |w| cos theta)^3) / |det v| states per volume, and
/// Int dOmega (1 + w cos theta)^-3 = 2 pi Int_-1^1 du (1 + w u)^-3 = 4 pi/(1 - w^2)^2 (elementary: the antiderivative is
/// -(1 + w u)^-2 / (2w)), giving N = eps^3 / (6 pi^2 |det v| (1 - w^2)^2).
/// </summary>
public class TiltedConeTests
{
    // The solid-angle integral by 64-point Gauss-Legendre in u = cos theta against 4 pi/(1 - w^2)^2 (derived above),
    // and NodeHeat.TiltFactor against the same integral over 4 pi.
    [Theory]
    [InlineData(0.0)]
    [InlineData(0.3)]
    [InlineData(0.834)]
    [InlineData(0.95)]
    public void SolidAngleIntegralOfTheTiltedConeIsFourPiOverOneMinusWSquaredSquared(double w)
    {
        double integral = 2 * Math.PI * GaussLegendreRule.Integrate(u => Math.Pow(1 + w * u, -3), -1, 1, 64);
        double closed = 4 * Math.PI / Math.Pow(1 - w * w, 2);
        Assert.Equal(closed, integral, closed * 1e-9);
        Assert.Equal(integral / (4 * Math.PI), NodeHeat.TiltFactor(w), 1e-9 * closed);
    }

    [Theory]
    [InlineData(1.0)]
    [InlineData(1.3)]
    [InlineData(-0.1)]
    public void TypeTwoOrNegativeTiltHasNoTiltFactor(double w) =>
        Assert.Throws<ArgumentException>(() => NodeHeat.TiltFactor(w));

    // Counting states of an anisotropic, tilted continuum cone on a fine q-grid: the volume of the upper cone below eps
    // against eps^3 / (6 pi^2 |det v| (1 - w^2)^2) times (2 pi)^3 (derived in the class comment; w = |v^-1 v0| by
    // solving v w = v0). Midpoint counting of a smooth region converges as 1/n^2; 160^3 points give ~0.3 %.
    [Fact]
    public void CountedStatesOfAnAnisotropicTiltedConeFollowTheTiltedLaw()
    {
        var v = Matrix<double>.Build.DenseOfArray(new[,] { { 2.0, 0.3, 0.0 }, { -0.2, 1.0, 0.1 }, { 0.0, 0.4, 0.6 } });
        var v0 = Vector<double>.Build.DenseOfArray([0.5, -0.4, 0.25]);
        var wv = v.Solve(v0);
        double w = wv.L2Norm(), det = Math.Abs(v.Determinant()), eps = 1.0;
        Assert.InRange(w, 0.5, 0.9); // a strongly tilted type-I cone
        // Bound the region: |p| <= eps/(1 - w) and |q| <= |p| / smallest singular value of v.
        double reach = eps / (1 - w) / v.Svd().S.Minimum() * 1.01;
        int n = 160;
        double h = 2 * reach / n;
        long inside = 0;
        var vt = v.Transpose();
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
                for (int l = 0; l < n; l++)
                {
                    double qx = -reach + (i + 0.5) * h, qy = -reach + (j + 0.5) * h, qz = -reach + (l + 0.5) * h;
                    double px = vt[0, 0] * qx + vt[0, 1] * qy + vt[0, 2] * qz;
                    double py = vt[1, 0] * qx + vt[1, 1] * qy + vt[1, 2] * qz;
                    double pz = vt[2, 0] * qx + vt[2, 1] * qy + vt[2, 2] * qz;
                    double e = v0[0] * qx + v0[1] * qy + v0[2] * qz + Math.Sqrt(px * px + py * py + pz * pz);
                    if (e < eps) inside++;
                }
        double counted = inside * h * h * h / Math.Pow(2 * Math.PI, 3);
        double law = Math.Pow(eps, 3) / (6 * Math.PI * Math.PI * det * Math.Pow(1 - w * w, 2));
        Assert.Equal(law, counted, law * 0.01);
    }

    // The same count on a lattice: the adaptive tetrahedron mesh of the two-node tilted lattice Weyl model
    // (TiltedWeylLattice: |det hbar v| = (t a)^3, w = c) holds N(eps) - N(0) = 2 a^3 eps^3 / (6 pi^2 (t a)^3 (1 - c^2)^2)
    // states per cell for eps well inside the linear cone (corrections of order (eps/t)^2), and the T = 0 Fermi level
    // of the compensated semimetal sits on the node energy 0 (electron count, common practice).
    [Fact]
    public void AdaptiveMeshCountsTheTiltedLatticeConesAndPutsTheFermiLevelOnTheNodes()
    {
        double t = 10, a = 3, c = 0.6, eps = 0.02 * t;
        var source = new TiltedWeylLattice(t, a, c);
        var dos = new AdaptiveTetrahedronDos(source, new AdaptiveMeshOptions
        {
            BaseMesh = 8, ReferenceEnergy = 0, Window = 2 * eps, Floor = 0.01 * eps, RelativeTolerance = 0.05,
        });
        Assert.False(dos.BudgetExhausted);
        var (fermi, rhoF) = dos.FermiLevel(1);
        Assert.InRange(Math.Abs(fermi), 0, 1e-4 * eps);
        var n = dos.Compute([0.0, eps]);
        double law = 2 * eps * eps * eps / (6 * Math.PI * Math.PI * t * t * t * Math.Pow(1 - c * c, 2));
        Assert.Equal(law, n.Integrated[1] - n.Integrated[0], law * 0.02);
        Assert.Equal(1, n.Integrated[0], 1e-9);
        // The DOS at eps: 3 N / eps on the E^2 law, and it vanishes at the node.
        Assert.Equal(3 * law / eps, n.Total[1], 3 * law / eps * 0.03);
        Assert.InRange(rhoF, 0, 1e-3 * 3 * law / eps);
    }
}
