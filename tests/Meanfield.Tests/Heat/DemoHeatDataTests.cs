using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class DemoHeatDataTests
{
    internal static string RepoFile(string relative)
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir != null && !File.Exists(Path.Combine(dir.FullName, "meanfield.sln"))) dir = dir.Parent;
        return Path.Combine(dir?.FullName ?? throw new InvalidOperationException("repository root not found"), relative);
    }

    private const string DemoPath = "models/measured/demo-heavy-metal-heat.csv";

    // Reproducibility of the invented demo file: the committed file is exactly what DemoHeatData.Write produces.
    // Regenerate with MEANFIELD_REGENERATE_DEMO=1 dotnet test --filter DemoFileIsReproducible.
    [Fact]
    public void DemoFileIsReproducible()
    {
        var sw = new StringWriter();
        DemoHeatData.Write(sw);
        string path = RepoFile(DemoPath);
        if (Environment.GetEnvironmentVariable("MEANFIELD_REGENERATE_DEMO") == "1") File.WriteAllText(path, sw.ToString());
        Assert.Equal(sw.ToString().ReplaceLineEndings(), File.ReadAllText(path).ReplaceLineEndings());
    }

    // Demo round trip (invented data, so only a consistency check of the pipeline): after subtracting the Debye term the
    // Sommerfeld fit below 6 K returns gamma = 180 mJ mol^-1 K^-2 and the node beta within 4 standard errors, and
    // v* from beta with 8 nodes returns hbar v = 30 meV A within 4 of its errors.
    [Fact]
    public void DemoDataRecoversInventedParameters()
    {
        var raw = MeasuredHeatCsv.Load(RepoFile(DemoPath));
        Assert.Equal(DemoHeatData.Points, raw.Curve.Count);
        var electronic = PhononSubtraction.Debye(raw, DemoHeatData.DebyeTemperatureK, DemoHeatData.AtomsPerFormulaUnit);
        var curve = electronic.Curve.WithSigma(raw.Curve.MolarHeat.Select(c => DemoHeatData.RelativeNoise * c).ToArray());
        var fit = SommerfeldFit.Fit(curve, 0, 20);
        Assert.InRange(Math.Abs(fit.Gamma - DemoHeatData.Gamma), 0, 4 * fit.GammaError);
        Assert.InRange(Math.Abs(fit.Beta - DemoHeatData.NodeBeta), 0, 4 * fit.BetaError);
        var node = new NodeHeat(EnergyUnit.MilliElectronVolt, DemoHeatData.CellVolume, DemoHeatData.FormulaUnitsPerCell);
        var v = node.VelocityFromBeta(fit.Beta, fit.BetaError, DemoHeatData.Nodes);
        Assert.InRange(Math.Abs(v.HbarV - DemoHeatData.NodeHbarV), 0, 4 * v.HbarVError);
    }
}
