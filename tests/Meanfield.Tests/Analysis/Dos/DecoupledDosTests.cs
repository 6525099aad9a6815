using Meanfield.Analysis;
using Meanfield.Models;
using Meanfield.Solutions;
using Meanfield.Solver;
using Meanfield.Tests.Cli;
using Meanfield.Units;

namespace Meanfield.Tests.Analysis.Dos;

/// <summary>
/// Above T_K^MF the shells decouple (r = 0): the f level is a flat line pinned at mu, a delta function rather than a
/// band, and the DOS at mu is that of the conduction band alone. For the shipped simple-cubic Kondo insulator the
/// conduction band is half filled at r = 0 (one of its two electrons per cell sits in the shell), so the DOS at mu is
/// the band-centre DOS of nearest-neighbour simple-cubic hopping, about 0.143 / t per spin (Economou, Green's Functions
/// in Quantum Physics, 3rd ed. (2006), ch. 5; value from memory), twice that per cell for two spin states.
/// </summary>
public class DecoupledDosTests
{
    [Theory]
    [InlineData(16)]
    [InlineData(24)]
    public void DecoupledDosAtMuIsTheConductionBandCentreValueAndNoCorrelatedPart(int mesh)
    {
        var model = ModelBinder.Bind(ModelFile.Load(CliRun.ModelPath("kondo-insulator-sc.toml")), new Dictionary<string, string> { ["V"] = "110" });
        const double t = 100; // the model file's nearest-neighbour hopping (meV)
        var settings = new SolverSettings { Temperature = 10 / model.Unit.Kelvins(), Mesh = mesh };
        var solution = Solution.FromSaddlePoint(model, new SaddlePointSolver(model, settings).Solve(), settings);
        Assert.True(solution.Decoupled);
        var columns = SpectrumSummary.Compute(solution, new SpectrumRequest { Dos = true, Heat = false }).Columns;
        Assert.Null(columns.DosFermiCorrelated);
        double perSpin = columns.DosFermiTotal!.Value / 2 * t;
        Assert.InRange(perSpin, 0.143 * 0.97, 0.143 * 1.03);
        // The `dos` entry point reads the DOS at mu by the same rule, on its own (Gamma-centred) mesh.
        var study = Meanfield.Analysis.Dos.DosStudy.Run(solution, new Meanfield.Analysis.Dos.DosRequest { Mesh = mesh });
        Assert.True(double.IsNaN(study.AtMu.Correlated));
        Assert.InRange(study.AtMu.Total / 2 * t, 0.143 * 0.97, 0.143 * 1.03);
    }
}
