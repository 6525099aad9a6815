using Meanfield.Binding;
using Meanfield.Models;
using Meanfield.Solver;
using Meanfield.Symmetry;
using Meanfield.Tests.Cli;
using Xunit.Abstractions;

namespace Meanfield.Tests.Solver;

/// <summary>
/// The analytic Jacobian of the saddle-point residuals (first-order perturbation theory with the Fermi-function
/// derivative and dmu/dx at fixed N) against finite differences of the residuals themselves (the derivative's
/// definition; Richardson-extrapolated central differences, Press et al., Numerical Recipes, 3rd ed. (2007), sec. 5.7),
/// and the Newton solver against the Broyden one on the full mesh: the same equations must give the same saddle point.
/// </summary>
public class NewtonJacobianTests(ITestOutputHelper output)
{
    private static BoundModel Shipped(string file) => ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath(file)), null);

    private static SolverSettings Settings(BoundModel model, int mesh) => new()
    {
        Temperature = model.Solver?.Temperature ?? 0, Mesh = mesh, Shifted = model.Solver?.Shifted ?? true,
        DosNodes = 2048,
    };

    /// <summary>Relative agreement demanded of the analytic and the finite-difference Jacobian.</summary>
    private const double JacobianTolerance = 1e-6;

    [Theory]
    [InlineData("kondo-insulator-sc.toml", 8)]
    [InlineData("heavy-metal-cubic.toml", 8)]
    [InlineData("weyl-diamond.toml", 8)]
    [InlineData("honeycomb-2d.toml", 12)]
    [InlineData("flat-band.toml", 0)]
    public void AnalyticJacobianMatchesFiniteDifferences(string file, int mesh)
    {
        var model = Shipped(file);
        var settings = Settings(model, Math.Max(mesh, 2));
        var sp = new SaddlePointSolver(model, settings).Solve();
        Assert.True(sp.Converged);
        // Off the saddle point: 3% larger r, lambda shifted by 2% of the f level.
        var x = sp.Amplitudes.Pack();
        int g = x.Length / 2;
        for (int i = 0; i < g; i++) { x[i] *= 1.03; x[g + i] += 0.02 * Math.Abs(model.Shells[0].Level); }
        var solver = new SaddlePointSolver(model, settings);
        var (analytic, numeric) = solver.JacobianCheck(x);
        Assert.NotNull(analytic);
        double scale = numeric.Max(Math.Abs), worst = 0;
        for (int i = 0; i < numeric.Length; i++) worst = Math.Max(worst, Math.Abs(analytic![i] - numeric[i]));
        output.WriteLine($"{file}: max |J| {scale:G4}, max |analytic - numeric| {worst:G3} ({worst / scale:G3} relative)");
        output.WriteLine("analytic " + string.Join(" ", analytic!.Select(v => v.ToString("G8"))));
        output.WriteLine("numeric  " + string.Join(" ", numeric.Select(v => v.ToString("G8"))));
        Assert.True(worst <= JacobianTolerance * scale, $"Jacobian off by {worst / scale:G3} relative");
    }

    /// <summary>Results of the Newton solver on the reduced mesh agree with Broyden on the full mesh to this (relative).</summary>
    private const double SolutionTolerance = 1e-9;

    [Theory]
    [InlineData("kondo-insulator-sc.toml", 10)]
    [InlineData("heavy-metal-cubic.toml", 10)]
    [InlineData("weyl-diamond.toml", 10)]
    [InlineData("honeycomb-2d.toml", 12)]
    [InlineData("flat-band.toml", 0)]
    public void NewtonOnTheWedgeGivesTheBroydenSolution(string file, int mesh)
    {
        var model = Shipped(file);
        var settings = Settings(model, Math.Max(mesh, 2)) with { Tolerance = 1e-12 };
        var fast = new SaddlePointSolver(model, settings).Solve();
        var plain = new SaddlePointSolver(model, settings with { Symmetry = SymmetryRequest.None, AnalyticJacobian = false }).Solve();
        output.WriteLine($"{file}: Newton {fast.Iterations} iterations / {fast.ZonePasses} passes, Broyden {plain.Iterations} / {plain.ZonePasses}; {fast.Symmetry}");
        Assert.True(fast.Converged && plain.Converged);
        Assert.Equal(plain.Branch, fast.Branch);
        Close(plain.FreeEnergy, fast.FreeEnergy, "F");
        for (int i = 0; i < fast.Groups.Count; i++)
        {
            Close(plain.Groups[i].R, fast.Groups[i].R, "r");
            Close(plain.Groups[i].Lambda, fast.Groups[i].Lambda, "lambda");
        }
        // Inside a gap N(mu) is flat to e^{-gap/2T}: mu is fixed only as far as the electron count resolves it.
        if (fast.FermiLevel == FermiLevelStatus.Regular && !Gapped(model, settings, fast)) Close(plain.Mu, fast.Mu, "mu");

        static bool Gapped(BoundModel model, SolverSettings settings, SaddlePoint sp)
        {
            var probe = new SaddlePointSolver(model, settings with { Symmetry = SymmetryRequest.None });
            var table = probe.StateSum.Fill(sp.Amplitudes);
            double below = double.NegativeInfinity, above = double.PositiveInfinity;
            foreach (var e in table.Energy) if (e < sp.Mu) below = Math.Max(below, e); else above = Math.Min(above, e);
            return above - below > 20 * settings.Temperature;
        }

        void Close(double a, double b, string what)
        {
            double scale = Math.Max(Math.Abs(a), Math.Abs(model.Shells[0].Level) * 1e-3);
            output.WriteLine($"  {what}: {a:R} vs {b:R} ({(a - b) / scale:G3} relative)");
            Assert.True(Math.Abs(a - b) <= SolutionTolerance * scale, $"{what}: {a:R} vs {b:R}");
        }
    }
}
