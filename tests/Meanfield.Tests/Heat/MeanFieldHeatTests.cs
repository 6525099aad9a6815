using Meanfield.Heat;
using Meanfield.Lattices;
using Meanfield.Solver;
using Meanfield.Tests.Support;
using Meanfield.Units;
using Xunit.Abstractions;

namespace Meanfield.Tests.Heat;

public class MeanFieldHeatTests(ITestOutputHelper output)
{
    // Simple-cubic Anderson lattice (hopping -t, on-site V, N = 2, Q = 1, 1.6 electrons) on a small shifted mesh.
    private const double T = 100, V = 120, Ef = -250, Electrons = 1.6;
    private const int N = 2, Mesh = 10;

    private static Func<double, Renormalization.MeanFieldAmplitudes?, SaddlePoint> Solver()
    {
        var model = TestModels.LocalHybridization(LatticeKind.SimpleCubic, T, V, Ef, N, Electrons);
        return (t, guess) => new SaddlePointSolver(model, new SolverSettings
            { Temperature = t, Mesh = Mesh, Tolerance = 1e-12, MaxIterations = 200, InitialGuess = guess }).Solve();
    }

    // Heat capacity per cell (k_B = 1) of the bare conduction band eps_k = -2t (cos k_x a + cos k_y a + cos k_z a) on the
    // same shifted mesh, N-fold degenerate, holding N_e - Q electrons at fixed count:
    // C = (1/T^2) [sum (e-mu)^2 f(1-f) - (sum (e-mu) f(1-f))^2 / sum f(1-f)] (Ashcroft & Mermin (1976), ch. 2, at fixed N).
    private static double ConductionHeatPerCell(double temperature)
    {
        var mesh = new KMesh(Lattice.Create(LatticeKind.SimpleCubic, 4.0), Mesh, true);
        var e = new double[mesh.Count];
        for (int k = 0; k < mesh.Count; k++)
        {
            var q = mesh.Cartesian(k) * 4.0;
            e[k] = -2 * T * (Math.Cos(q.X) + Math.Cos(q.Y) + Math.Cos(q.Z));
        }
        double w = (double)N / mesh.Count, target = Electrons - 1, lo = -7 * T, hi = 7 * T;
        double Fermi(double x) => 1 / (1 + Math.Exp(x / temperature));
        for (int i = 0; i < 200; i++)
        {
            double mu = 0.5 * (lo + hi);
            if (e.Sum(x => w * Fermi(x - mu)) < target) lo = mu; else hi = mu;
        }
        double m = 0.5 * (lo + hi), a0 = 0, a1 = 0, a2 = 0;
        foreach (double x in e)
        {
            double f = Fermi(x - m), g = w * f * (1 - f), d = (x - m) / temperature;
            a0 += g; a1 += g * d; a2 += g * d * d;
        }
        return a2 - a1 * a1 / a0;
    }

    [Fact]
    public void FullMeanFieldHeatJumpsAtTheKondoScaleAndDropsToTheConductionBand()
    {
        var solve = Solver();
        var unit = EnergyUnit.MilliElectronVolt;
        double k = unit.Kelvins();
        var scale = KondoTemperature.Find(solve, 0.5, 1e-4);
        Assert.NotNull(scale.Temperature);
        double tk = scale.Temperature!.Value * k;
        var grid = MeanFieldHeat.Grid(0.5 * tk, 1.5 * tk, 31);
        var sweep = MeanFieldHeat.Sweep(solve, unit, 1, grid);
        var pts = sweep.Points;
        output.WriteLine($"T_K^MF = {tk:G6} K; branch change between {sweep.LastKondoK:G6} and {sweep.FirstDecoupledK:G6} K");
        foreach (var p in pts)
            output.WriteLine($"{p.TemperatureK,10:G5} {p.Branch,-10} r={p.MinR,-10:G4} C={p.MolarHeat:G6} conduction={HeatUnits.MolarFromPerCell(ConductionHeatPerCell(p.TemperatureK / k), 1):G6}");

        // The jump sits at T_K^MF (from the independent continuation + bisection) within one grid step.
        Assert.NotNull(sweep.LastKondoK);
        Assert.InRange(tk, sweep.LastKondoK!.Value * (1 - 1e-6), sweep.FirstDecoupledK!.Value * (1 + 1e-6));

        // Above T_K^MF (stencils wholly decoupled) C is the bare conduction band's, to 1 % (the r = 0 branch's f part,
        // eps_f Q - T S_mf, is linear in T and adds nothing to d^2F/dT^2).
        var above = Enumerable.Range(1, pts.Count - 2).Where(i => pts[i - 1].Branch == SaddlePointBranch.Decoupled).ToList();
        var below = Enumerable.Range(1, pts.Count - 2).Where(i => pts[i + 1].Branch == SaddlePointBranch.Kondo).ToList();
        Assert.True(above.Count >= 5 && below.Count >= 8, $"{above.Count} points above, {below.Count} below");
        foreach (int i in above)
        {
            double expected = HeatUnits.MolarFromPerCell(ConductionHeatPerCell(pts[i].TemperatureK / k), 1);
            Assert.Equal(expected, pts[i].MolarHeat, 0.01 * expected);
        }

        // Below T_K^MF C is continuous: steps between neighbours shrink with the grid spacing (h/T_K = 1/30 here),
        // while the jump at T_K^MF does not; every step below is under 0.3 of the jump.
        double cBelow = pts[below[^1]].MolarHeat, cAbove = pts[above[0]].MolarHeat, jump = cBelow - cAbove;
        output.WriteLine($"C just below {cBelow:G5}, just above {cAbove:G5} J/mol/K");
        Assert.True(jump > 0.2 * cAbove, $"no clear jump: {cBelow} -> {cAbove}");
        for (int j = 1; j < below.Count; j++)
            Assert.True(Math.Abs(pts[below[j]].MolarHeat - pts[below[j - 1]].MolarHeat) < 0.3 * jump,
                        $"step at {pts[below[j]].TemperatureK} K");
    }
}
