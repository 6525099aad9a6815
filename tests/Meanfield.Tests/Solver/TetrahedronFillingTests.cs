using Meanfield.Lattices;
using Meanfield.Solver;
using Xunit.Abstractions;

namespace Meanfield.Tests.Solver;

/// <summary>
/// T = 0 filling by linear tetrahedra (Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994)) on bands given in closed
/// form, so no diagonalisation is involved: nearest-neighbour cosine bands eps(k) = -2t sum_i cos(2 pi u_i).
/// </summary>
public class TetrahedronFillingTests(ITestOutputHelper output)
{
    private const double T = 1.0; // hopping (invented unit)

    private static double Cosines(KMesh mesh, int k)
    {
        var u = mesh.Reduced(k);
        double s = Math.Cos(2 * Math.PI * u.X) + Math.Cos(2 * Math.PI * u.Y);
        return mesh.Lattice.Dimension == 3 ? s + Math.Cos(2 * Math.PI * u.Z) : s;
    }

    private static double[] Band(KMesh mesh, Func<KMesh, int, double> energy)
    {
        var e = new double[mesh.Count];
        for (int k = 0; k < mesh.Count; k++) e[k] = energy(mesh, k);
        return e;
    }

    private static double BandEnergy(TetrahedronFilling tetra, double[] e, double mu)
    {
        double sum = 0;
        for (int s = 0; s < e.Length; s++) sum += tetra.Weights[s] * (e[s] - mu);
        return sum;
    }

    /// <summary>
    /// &lt;|cos x + cos y + cos z|&gt; over the cube, reduced to a 2D average by the closed form of the z average:
    /// (1/pi) int_0^pi |a + cos z| dz = |a| for |a| &gt;= 1 and (2/pi) (a asin a + sqrt(1 - a^2)) otherwise (elementary:
    /// split at the sign change z0 = pi/2 + asin a). The integrand is C^1, so the midpoint rule converges as h^2.
    /// </summary>
    private static double MeanAbsThreeCosines(int m)
    {
        double sum = 0;
        for (int i = 0; i < m; i++)
            for (int j = 0; j < m; j++)
            {
                double a = Math.Cos(Math.PI * (i + 0.5) / m) + Math.Cos(Math.PI * (j + 0.5) / m);
                sum += Math.Abs(a) >= 1 ? Math.Abs(a) : 2 / Math.PI * (a * Math.Asin(a) + Math.Sqrt(1 - a * a));
            }
        return sum / ((double)m * m);
    }

    /// <summary>
    /// Half filling of the simple-cubic band: mu = 0 exactly by particle-hole symmetry (k -&gt; k + (pi, pi, pi) maps
    /// eps to -eps and every even mesh, Gamma-centred or shifted, onto itself; common practice), and the band energy per
    /// site converges to -t &lt;|cos x + cos y + cos z|&gt; (occupied states are those with sum cos &gt; 0 and the sum
    /// averages to zero), evaluated independently in <see cref="MeanAbsThreeCosines"/>.
    /// </summary>
    [Fact]
    public void SimpleCubicHalfFillingConvergesToTheExactBandEnergy()
    {
        double exact = -T * MeanAbsThreeCosines(1000); // 1.00241973510 t; the midpoint rule at m = 2000 moves it by 2e-10
        output.WriteLine($"exact band energy {exact:R}");
        var lattice = Lattice.Create(LatticeKind.SimpleCubic, 1.0);
        double previousLinear = double.PositiveInfinity, previousBloechl = double.PositiveInfinity;
        foreach (int n in new[] { 8, 16, 32 })
            foreach (bool shifted in new[] { false, true })
            {
                var mesh = new KMesh(lattice, n, shifted);
                var e = Band(mesh, (m, k) => -2 * T * Cosines(m, k));
                var linear = new TetrahedronFilling(mesh, 1, bloechl: false);
                var bloechl = new TetrahedronFilling(mesh, 1);
                var rl = linear.Solve(e, 0.5);
                var rb = bloechl.Solve(e, 0.5);
                Assert.Equal(0.0, rl.Mu, 12);
                Assert.Equal(0.0, rb.Mu, 12);
                Assert.Equal(0.5, bloechl.Weights.ToArray().Sum(), 12);
                double errLinear = BandEnergy(linear, e, 0) - exact, errBloechl = BandEnergy(bloechl, e, 0) - exact;
                output.WriteLine($"mesh {n} {(shifted ? "shifted" : "gamma")}: error linear {errLinear:G3}, Bloechl {errBloechl:G3}");
                errLinear = Math.Abs(errLinear); errBloechl = Math.Abs(errBloechl);
                // Linear tetrahedra: error ~ h^2 (a factor 4 per mesh doubling). Bloechl's correction removes the
                // leading h^2 term (PRB 49, 16223, Sec. IV), so it wins by more than a factor 10 here.
                Assert.True(errBloechl < errLinear / 10, $"mesh {n}: Bloechl error {errBloechl} not far below linear {errLinear}");
                if (!shifted) continue;
                Assert.True(errLinear < previousLinear / 3.5, $"linear error {errLinear} did not fall as h^2 from {previousLinear}");
                Assert.True(errBloechl < previousBloechl, $"Bloechl error {errBloechl} did not fall from {previousBloechl}");
                previousLinear = errLinear; previousBloechl = errBloechl;
            }
        Assert.True(previousBloechl < 5e-5 * Math.Abs(exact), $"Bloechl error {previousBloechl} at 32^3");
    }

    /// <summary>
    /// Square lattice at half filling (linear triangles): mu = 0 by particle-hole symmetry and the band energy per
    /// site -t &lt;|cos x + cos y|&gt; = -8t/pi^2 (cos x + cos y = 2 cos u cos v with u, v = (x +- y)/2, and
    /// &lt;|cos|&gt; = 2/pi; common practice).
    /// </summary>
    [Fact]
    public void SquareLatticeHalfFillingGivesMinusEightTOverPiSquared()
    {
        double exact = -8 * T / (Math.PI * Math.PI), previous = double.PositiveInfinity;
        var lattice = Lattice.Create(LatticeKind.Square, 1.0);
        foreach (int n in new[] { 16, 32, 64 })
        {
            var mesh = new KMesh(lattice, n, shifted: true);
            var e = Band(mesh, (m, k) => -2 * T * Cosines(m, k));
            var tetra = new TetrahedronFilling(mesh, 1);
            var r = tetra.Solve(e, 0.5);
            Assert.Equal(0.0, r.Mu, 12);
            double err = Math.Abs(BandEnergy(tetra, e, 0) - exact);
            output.WriteLine($"mesh {n}: band energy error {err:G3}");
            Assert.True(err < previous / 3, $"error {err} did not fall from {previous}");
            previous = err;
        }
        Assert.True(previous < 1e-3 * Math.Abs(exact));
    }

    /// <summary>
    /// Insulator: two cosine bands -D + eps(k)/5 and D + eps(k)/5 (edges -D +- 6t/5 and D +- 6t/5, exact on a Gamma-centred
    /// even mesh, which holds Gamma and R) at one electron per cell: N(mu) = 1 on the whole gap, mu at its middle (0 by
    /// symmetry), every weight 1/N_k or 0. A shifted mesh misses the band edges, so its window holds the true gap.
    /// </summary>
    [Fact]
    public void InsulatorWindowIsTheGapAndMuIsMidGap()
    {
        const double d = 3.0;
        var lattice = Lattice.Create(LatticeKind.SimpleCubic, 1.0);
        foreach (bool shifted in new[] { false, true })
        {
            var mesh = new KMesh(lattice, 6, shifted);
            var e = new double[2 * mesh.Count];
            for (int k = 0; k < mesh.Count; k++) { double c = -0.4 * T * Cosines(mesh, k); e[2 * k] = -d + c; e[2 * k + 1] = d + c; }
            var tetra = new TetrahedronFilling(mesh, 2);
            var r = tetra.Solve(e, 1.0);
            output.WriteLine($"{(shifted ? "shifted" : "gamma")}: mu {r.Mu:G6}, window [{r.Window.Lower:G6}, {r.Window.Upper:G6}]");
            Assert.Equal(0.0, r.Mu, 12);
            Assert.Equal(r.Window.Middle, r.Mu, 12);
            if (shifted) { Assert.True(r.Window.Lower < -d + 1.2 * T); Assert.True(r.Window.Upper > d - 1.2 * T); }
            else { Assert.Equal(-d + 1.2 * T, r.Window.Lower, 12); Assert.Equal(d - 1.2 * T, r.Window.Upper, 12); }
            for (int k = 0; k < mesh.Count; k++)
            {
                Assert.Equal(1.0 / mesh.Count, tetra.Weights[2 * k], 15);
                Assert.Equal(0.0, tetra.Weights[2 * k + 1]);
            }
        }
    }

    /// <summary>
    /// N(mu) is continuous and monotone, and mu from Newton meets a fractional count: a quarter-filled cosine band
    /// (the count tested against the sum of the weights, and mu against the integrated count at other fillings).
    /// </summary>
    [Fact]
    public void FractionalFillingIsMetAndMuGrowsWithTheCount()
    {
        var mesh = new KMesh(Lattice.Create(LatticeKind.SimpleCubic, 1.0), 10, shifted: true);
        var e = Band(mesh, (m, k) => -2 * T * Cosines(m, k));
        var tetra = new TetrahedronFilling(mesh, 1);
        double last = double.NegativeInfinity;
        foreach (double ne in new[] { 0.01, 0.1, 0.25, 0.5, 0.75, 0.99 })
        {
            var r = tetra.Solve(e, ne);
            Assert.Equal(ne, r.Electrons, 12);
            Assert.Equal(ne, tetra.Weights.ToArray().Sum(), 12);
            Assert.Equal(0.0, r.Window.Width);
            Assert.True(r.Mu > last);
            Assert.True(tetra.LastCountPasses < 30, $"{tetra.LastCountPasses} Newton passes at N_e = {ne}");
            last = r.Mu;
        }
        // Particle-hole symmetry: mu(N_e) = -mu(1 - N_e) (common practice for bipartite lattices).
        Assert.Equal(-tetra.Solve(e, 0.25).Mu, tetra.Solve(e, 0.75).Mu, 11);
    }

    /// <summary>
    /// Hellmann-Feynman consistency: with linear weights F(p) = Omega_lin + mu N_e at fixed N_e has dF/dp =
    /// sum_k w_k dE_k/dp exactly (the derivative of the occupied integral of E - mu with respect to a corner energy
    /// is that corner's weight; the Fermi-surface term vanishes; Bloechl et al. 1994, App. B). With Bloechl's correction
    /// the identity holds only to the size of the correction, which shrinks with the mesh.
    /// </summary>
    [Fact]
    public void LinearWeightsAreTheGradientOfTheBandEnergy()
    {
        var lattice = Lattice.Create(LatticeKind.SimpleCubic, 1.0);
        const double ne = 0.37, p0 = 1.0, h = 1e-5;
        double previous = double.PositiveInfinity;
        foreach (int n in new[] { 6, 12 })
        {
            var mesh = new KMesh(lattice, n, shifted: true);
            var slope = Band(mesh, (m, k) => -2 * T * Cosines(m, k));
            var other = Band(mesh, (m, k) => 0.7 * T * Math.Cos(2 * Math.PI * (m.Reduced(k).X - m.Reduced(k).Y)));
            foreach (bool bloechl in new[] { false, true })
            {
                var tetra = new TetrahedronFilling(mesh, 1, bloechl);
                double F(double p)
                {
                    var e = new double[mesh.Count];
                    for (int k = 0; k < e.Length; k++) e[k] = p * slope[k] + other[k];
                    var r = tetra.Solve(e, ne);
                    return BandEnergy(tetra, e, r.Mu) + r.Mu * ne;
                }
                double numeric = (F(p0 + h) - F(p0 - h)) / (2 * h);
                F(p0);
                double analytic = 0;
                for (int k = 0; k < mesh.Count; k++) analytic += tetra.Weights[k] * slope[k];
                double mismatch = Math.Abs(numeric - analytic) / Math.Abs(analytic);
                output.WriteLine($"mesh {n}, Bloechl {bloechl}: dF/dp {numeric:R} vs sum w dE/dp {analytic:R} (relative {mismatch:G3})");
                if (!bloechl) Assert.True(mismatch < 1e-8, $"linear weights: relative mismatch {mismatch}");
                else { Assert.True(mismatch < previous, $"Bloechl mismatch {mismatch} did not shrink from {previous}"); previous = mismatch; }
            }
        }
    }

    [Fact]
    public void BadInputIsRefused()
    {
        var mesh = new KMesh(Lattice.Create(LatticeKind.SimpleCubic, 1.0), 4);
        var tetra = new TetrahedronFilling(mesh, 2);
        Assert.Contains("expects 128 energies", Assert.Throws<ArgumentException>(() => tetra.Solve(new double[10], 1)).Message);
        Assert.Contains("exceed", Assert.Throws<RequestError>(() => tetra.Solve(new double[128], 2.5)).Message);
        Assert.Throws<ArgumentException>(() => new TetrahedronFilling(mesh, 0));
    }
}

/// <summary>
/// A shifted mesh has a cell centred on Gamma whose 8 corners (u = +-1/(2N)) all lie at -6t cos(pi/N) for the
/// simple-cubic band (elementary), so the interpolated band is flat there and N(mu) jumps by 1/N_k at the band
/// bottom. Counts inside the jump are met by filling that cell partially, with mu at the flat level.
/// </summary>
public class TetrahedronFlatCellTests
{
    [Fact]
    public void CountInsideTheJumpOfAFlatCellFillsItPartially()
    {
        const int n = 4;
        var mesh = new KMesh(Lattice.Create(LatticeKind.SimpleCubic, 1.0), n, shifted: true);
        var e = new double[mesh.Count];
        for (int k = 0; k < mesh.Count; k++)
        {
            var u = mesh.Reduced(k);
            e[k] = -2 * (Math.Cos(2 * Math.PI * u.X) + Math.Cos(2 * Math.PI * u.Y) + Math.Cos(2 * Math.PI * u.Z));
        }
        double level = -6 * Math.Cos(Math.PI / n), jump = 1.0 / mesh.Count;
        var tetra = new TetrahedronFilling(mesh, 1, bloechl: false);
        var corrected = new TetrahedronFilling(mesh, 1);
        double previousEnergy = 0;
        foreach (double x in new[] { 0.1, 0.5, 0.9 })
        {
            var r = tetra.Solve(e, x * jump);
            Assert.Equal(level, r.Mu, 12);
            Assert.Equal(x * jump, r.Electrons, 14);
            double band = 0;
            for (int k = 0; k < e.Length; k++) band += tetra.Weights[k] * e[k];
            // Every electron of the flat cell sits at the level: the band energy is the level times the count
            // (linear weights; Bloechl's correction moves weight between corners at different energies).
            Assert.Equal(level * x * jump, band, 12);
            var rc = corrected.Solve(e, x * jump);
            Assert.Equal(level, rc.Mu, 12);
            Assert.Equal(x * jump, corrected.Weights.ToArray().Sum(), 14);
            Assert.True(band < previousEnergy);
            previousEnergy = band;
        }
        var above = tetra.Solve(e, 1.5 * jump);
        Assert.True(above.Mu > level);
        Assert.Equal(1.5 * jump, above.Electrons, 12);
    }
}
