using Meanfield.Analysis.Dos;
using Meanfield.Binding;
using Meanfield.Heat;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Renormalization;
using Meanfield.Bloch;
using Meanfield.Solver;
using Meanfield.Tests.Models;
using Meanfield.Units;
using Xunit.Abstractions;

namespace Meanfield.Tests.Heat;

/// <summary>Heat from the renormalized DOS of the shipped demo models, through <see cref="DosTabulation"/>.</summary>
public class QuasiparticleDosHeatTests(ITestOutputHelper output)
{
    private static (BoundModel Model, TetrahedronDos Engine) Solved(string file, int dosMesh)
    {
        var model = ModelBinder.Bind(ModelFile.Load(Path.Combine(ModelText.RepositoryRoot(), "models", file)));
        var h = model.Solver!;
        var sp = new SaddlePointSolver(model, new SolverSettings
        {
            Temperature = h.Temperature ?? 0, Mesh = h.Mesh ?? 16, Shifted = h.Shifted ?? true,
            Tolerance = h.Tolerance ?? 1e-10, MaxIterations = h.MaxIterations ?? 100,
        }).Solve();
        Assert.True(sp.Converged);
        var source = new RenormalizedHamiltonian(new BlochHamiltonian(model), sp.Amplitudes);
        return (model, new TetrahedronDos(source, new KMesh(model.Lattice, dosMesh)));
    }

    [Fact]
    public void MetalLowTemperatureCOverTIsTheSommerfeldValueOfTheSameDos()
    {
        // gamma = (pi^2/3) k_B^2 rho(E_F) per cell, times N_A / Z per mole of formula units (Ashcroft & Mermin, Solid
        // State Physics (1976), ch. 2, eq. 2.80). rho(E_F) is taken from the tetrahedron engine at one energy (not from the
        // tabulated grid the heat integrates), in states per cell per joule.
        var (model, engine) = Solved("heavy-metal-cubic.toml", 20);
        var dos = DosTabulation.ForHeat(engine, model, 0.05, 1.0);
        double ef = dos.GroundStateFermiLevel();
        double rhoPerJoule = engine.DosAtEnergy(ef).Total / model.Unit.Joules();
        double gamma = Math.PI * Math.PI / 3 * PhysicalConstants.Boltzmann * PhysicalConstants.Boltzmann * rhoPerJoule
                       * PhysicalConstants.Avogadro / model.FormulaUnitsPerCell;
        var heat = new QuasiparticleHeat(dos);
        double cOverT = heat.At(0.05).MolarHeatCapacity / 0.05;
        output.WriteLine($"E_F = {ef:G8} meV, rho = {engine.DosAtEnergy(ef).Total:G6}/meV/cell; gamma = {1e3 * gamma:G6}, C/T(0.05 K) = {1e3 * cOverT:G6} mJ/mol/K^2");
        Assert.Equal(gamma, cOverT, 0.01 * gamma);
        // The same DOS without its fine grids near E_F misses the heavy peak: the check can fail.
        var coarseOnly = new QuasiparticleHeat(DosTabulation.FromDensityOfStates(engine.Compute(new DosOptions { Points = 201 }), model));
        double coarse = coarseOnly.At(0.05).MolarHeatCapacity / 0.05;
        output.WriteLine($"coarse grid only: C/T = {1e3 * coarse:G6}");
        Assert.True(Math.Abs(coarse / gamma - 1) > 0.01);
    }

    [Fact]
    public void KondoInsulatorHeatIsActivatedOverHalfTheIndirectGap()
    {
        // Both hybridized bands have 3D parabolic edges, rho ~ sqrt(|E - E_edge|). For T << Delta (indirect gap) mu stays
        // near mid-gap (a mass asymmetry shifts it by (3/4) T ln(m_v/m_c), linear in T: a constant factor below), the
        // excited carriers on each side number n ~ T^{3/2} e^{-Delta/2T} (intrinsic semiconductor, Ashcroft & Mermin (1976),
        // ch. 28, eq. 28.22) and carry about Delta/2 each, so C = d(n Delta)/dT ~ T^{-1/2} Delta^2 e^{-Delta/2T}:
        // ln(C T^{1/2}) against 1/T has slope -Delta/2.
        var (model, engine) = Solved("kondo-insulator-sc.toml", 32);
        var sp = engine.Spectrum;
        int occ = (int)model.ElectronsPerCell;
        double top = double.NegativeInfinity, bottom = double.PositiveInfinity;
        for (int k = 0; k < sp.Mesh.Count; k++) { top = Math.Max(top, sp.Energy(k, occ - 1)); bottom = Math.Min(bottom, sp.Energy(k, occ)); }
        double kelvins = model.Unit.Kelvins(), gapK = (bottom - top) * kelvins;
        Assert.True(gapK > 0);
        var ratios = Enumerable.Range(0, 8).Select(i => 20.0 + 2 * i).ToArray(); // Delta / T from 20 to 34
        var dos = DosTabulation.ForHeat(engine, model, gapK / ratios[^1], gapK / ratios[0]);
        var heat = new QuasiparticleHeat(dos);
        var x = ratios.Select(r => r / gapK).ToArray(); // 1/T in 1/K
        var y = x.Select(u => Math.Log(heat.At(1 / u).MolarHeatCapacity * Math.Sqrt(1 / u))).ToArray();
        double slope = MathNet.Numerics.Fit.Line(x, y).B;
        output.WriteLine($"indirect gap {gapK:G5} K; slope {slope:G5} K vs -Delta/2 = {-gapK / 2:G5} K");
        Assert.Equal(-gapK / 2, slope, 0.05 * gapK / 2);
    }
}
