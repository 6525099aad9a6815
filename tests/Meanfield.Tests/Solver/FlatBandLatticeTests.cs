using Meanfield.Lattices;
using Meanfield.Solver;
using Meanfield.Tests.Support;
using Xunit.Abstractions;

namespace Meanfield.Tests.Solver;

/// <summary>
/// Closed-form T = 0 mean field of the lattice with a flat conduction DOS rho0 = 1/(2D) and local hybridization V, at
/// N_e = N (lower hybridized band full: a Kondo insulator). Derived here from the saddle-point equations of Newns &amp;
/// Read, Adv. Phys. 36, 799 (1987) and Hewson, The Kondo Problem to Heavy Fermions (1993), ch. 7, with a = rV and the
/// bands E_-(eps) = (eps + e)/2 - sqrt(((eps - e)/2)^2 + a^2), e = eps_f + lambda:
///   n_f   = N rho0 a^2 [1/(e - E_-(D)) - 1/(e - E_-(-D))]          (integral of rho0 a^2/(E - e)^2 over the lower band)
///   lambda = N rho0 V^2 [asinh((D - e)/(2a)) + asinh((D + e)/(2a))]  (from dF/dr = 0)
///   n_f + r^2 = Q,   mu = midpoint of the gap [E_-(D), E_+(-D)].
/// </summary>
public class FlatBandLatticeTests(ITestOutputHelper output)
{
    private const double D = 1000, V = 200;

    private static (double r, double lambda) ClosedForm(double ef, int n, double q)
    {
        double rho0 = 1 / (2 * D);
        double[] Res(double r, double l)
        {
            double e = ef + l, a = r * V;
            double Lower(double eps) => (eps + e) / 2 - Math.Sqrt((eps - e) * (eps - e) / 4 + a * a);
            double nf = n * rho0 * a * a * (1 / (e - Lower(D)) - 1 / (e - Lower(-D)));
            double lam = n * rho0 * V * V * (Math.Asinh((D - e) / (2 * a)) + Math.Asinh((D + e) / (2 * a)));
            return [nf + r * r - q, l - lam];
        }
        double x = 0.3, y = -ef;
        for (int it = 0; it < 200; it++)
        {
            var f = Res(x, y);
            if (Math.Abs(f[0]) + Math.Abs(f[1]) < 1e-15) break;
            double hx = 1e-7 * x, hy = 1e-7 * Math.Max(1, Math.Abs(y));
            var fx = Res(x + hx, y); var fy = Res(x, y + hy);
            double a11 = (fx[0] - f[0]) / hx, a12 = (fy[0] - f[0]) / hy, a21 = (fx[1] - f[1]) / hx, a22 = (fy[1] - f[1]) / hy;
            double det = a11 * a22 - a12 * a21;
            double dx = (-f[0] * a22 + f[1] * a12) / det, dy = (-a11 * f[1] + a21 * f[0]) / det;
            double s = 1;
            while (x + s * dx <= 0) s /= 2;
            x += s * dx; y += s * dy;
        }
        return (x, y);
    }

    [Theory]
    [InlineData(-300.0, 2)]
    [InlineData(-150.0, 2)]
    [InlineData(-400.0, 4)]
    public void KondoInsulatorMatchesClosedForm(double ef, int n)
    {
        var model = TestModels.LocalHybridization(LatticeKind.FlatDos, D, V, ef, n, electrons: n);
        var solver = new SaddlePointSolver(model, new SolverSettings { Temperature = 0, Tolerance = 1e-12 });
        var sp = solver.Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        var (r, lambda) = ClosedForm(ef, n, 1.0);
        double e = ef + lambda, a = r * V;
        double top = (D + e) / 2 - Math.Sqrt((D - e) * (D - e) / 4 + a * a);
        double bottom = (-D + e) / 2 + Math.Sqrt((-D - e) * (-D - e) / 4 + a * a);
        double mu = 0.5 * (top + bottom);
        output.WriteLine($"ef={ef} N={n}: r^2 {sp.Groups[0].Z:R} vs {r * r:R}; level {sp.Groups[0].RenormalizedLevel:R} vs {e - mu:R}; mu {sp.Mu:R} vs {mu:R}; {sp.Iterations} iterations, {sp.ZonePasses} passes, {sp.WallSeconds:F1} s");
        Assert.Equal(r * r, sp.Groups[0].Z, 1e-8);
        Assert.Equal(e - mu, sp.Groups[0].RenormalizedLevel, 1e-8 * D);
        Assert.Equal(mu, sp.Mu, 1e-8 * D);
    }

    /// <summary>
    /// Deep in the Kondo regime the lattice scale a^2/D = r^2 V^2 / D behaves as D exp(pi eps_f / (N Delta)) with
    /// Delta = pi rho0 V^2 (Hewson (1993) ch. 7; Newns &amp; Read (1987)): the slope of ln(r^2) against eps_f is pi/(N Delta).
    /// </summary>
    [Fact]
    public void KondoScaleIsExponentialInLevelOverWidth()
    {
        const int n = 2;
        double delta = Math.PI * V * V / (2 * D);
        double[] levels = [-500, -450, -400];
        var lnZ = levels.Select(ef =>
        {
            var sp = new SaddlePointSolver(TestModels.LocalHybridization(LatticeKind.FlatDos, D, V, ef, n, n),
                                           new SolverSettings()).Solve();
            Assert.True(sp.Converged);
            return Math.Log(sp.Groups[0].Z);
        }).ToArray();
        double slope = (lnZ[^1] - lnZ[0]) / (levels[^1] - levels[0]);
        output.WriteLine($"slope {slope:G6} vs pi/(N Delta) = {Math.PI / (n * delta):G6}");
        Assert.Equal(Math.PI / (n * delta), slope, 0.02 * Math.PI / (n * delta));
    }

    [Fact]
    public void FreeEnergyIsStationaryAtTheSolution()
    {
        // Stationarity of F in every r and lambda is the defining property of the saddle point (Newns & Read 1987).
        var model = TestModels.LocalHybridization(LatticeKind.SemiEllipticDos, D, V, -250, 2, 1.7);
        var settings = new SolverSettings { Temperature = 2.0, DosNodes = 8192 };
        var solver = new SaddlePointSolver(model, settings);
        var sp = solver.Solve();
        Assert.True(sp.Converged, string.Join(" ", sp.Notes));
        var x = sp.Amplitudes.Pack();
        for (int i = 0; i < x.Length; i++)
        {
            double h = 1e-4 * Math.Max(1, Math.Abs(x[i]));
            var xp = (double[])x.Clone(); xp[i] += h;
            var xm = (double[])x.Clone(); xm[i] -= h;
            double grad = (solver.FreeEnergyAt(Renormalization.MeanFieldAmplitudes.Unpack(xp))
                         - solver.FreeEnergyAt(Renormalization.MeanFieldAmplitudes.Unpack(xm))) / (2 * h);
            output.WriteLine($"dF/dx[{i}] = {grad:G3}");
            Assert.True(Math.Abs(grad) < 1e-5, $"dF/dx[{i}] = {grad}");
        }
    }
}

/// <summary>
/// Mean-field Kondo temperature of the flat-band lattice at N = 2, Q = 1, N_e = 2 (conduction band half filled, mu = 0
/// at r = 0, f level pinned at mu). Derived here: the r^2 coefficient of F at r -&gt; 0 is
/// lambda_0 - N rho0 V^2 Int_0^D tanh(eps/2T)/eps d eps with lambda_0 = -eps_f, and the integral equals
/// ln(2 e^gamma D / (pi T)) up to terms exponentially small in D/T (the BCS-type integral; Abrikosov, Gorkov &amp;
/// Dzyaloshinskii (1963) sec. 33, from memory). Hence T_K^MF = (2 e^gamma / pi) D exp(pi eps_f / (N Delta)),
/// Delta = pi rho0 V^2, i.e. T_K^MF / T_K = 2 e^gamma / pi = 1.1338659 with T_K = D exp(pi eps_f/(N Delta))
/// (Read &amp; Newns 1983; Hewson (1993) ch. 7).
/// </summary>
public class FlatBandKondoTemperatureTests(ITestOutputHelper output)
{
    [Theory]
    [InlineData(250.0, -300.0)]
    [InlineData(200.0, -250.0)]
    public void KondoTemperatureMatchesClosedForm(double v, double ef)
    {
        const double d = 1000;
        var model = TestModels.LocalHybridization(LatticeKind.FlatDos, d, v, ef, 2, electrons: 2);
        var result = KondoTemperature.FindFromStability(
            t => new SaddlePointSolver(model, new SolverSettings { Temperature = t }).DecoupledStability()!.Min(), 0.05);
        double delta = Math.PI * v * v / (2 * d);
        double expected = 2 * Math.Exp(0.5772156649015329) / Math.PI * d * Math.Exp(Math.PI * ef / (2 * delta));
        output.WriteLine($"V={v} ef={ef}: T_K^MF {result.Temperature:G8} vs closed form {expected:G8}");
        Assert.NotNull(result.Temperature);
        Assert.Equal(expected, result.Temperature!.Value, 1e-4 * expected);
    }

    [Fact]
    public void CoherentSolutionExistsBelowAndCollapsesAbove()
    {
        const double d = 1000, v = 250, ef = -300;
        var model = TestModels.LocalHybridization(LatticeKind.FlatDos, d, v, ef, 2, electrons: 2);
        double tk = 2 * Math.Exp(0.5772156649015329) / Math.PI * d * Math.Exp(ef * d / (v * v));
        var below = new SaddlePointSolver(model, new SolverSettings { Temperature = 0.8 * tk, DosNodes = 8192 }).Solve();
        var above = new SaddlePointSolver(model, new SolverSettings { Temperature = 1.2 * tk, DosNodes = 8192 }).Solve();
        output.WriteLine($"T = 0.8 T_K: {below.Branch} r = {below.Groups[0].R:G4}; T = 1.2 T_K: {above.Branch}");
        Assert.Equal(SaddlePointBranch.Kondo, below.Branch);
        Assert.True(below.Groups[0].R > 0.01);
        Assert.Equal(SaddlePointBranch.Decoupled, above.Branch);
        Assert.Equal(1.0, above.Groups[0].FOccupation, 12);
    }
}
