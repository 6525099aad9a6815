using Meanfield.Analysis.Dos;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// Picture of a DOS: total, conduction and correlated curves against E - mu (the table keeps absolute energies), a
/// dashed line at mu = 0, over the table's energy window.
/// </summary>
public static class DosPlot
{
    /// <summary>Saves the picture (.png or .svg by extension).</summary>
    /// <exception cref="ArgumentException">An extension other than .png or .svg.</exception>
    public static void Save(DensityOfStates dos, double mu, EnergyUnit unit, string path, string title)
    {
        var u = unit.Symbol();
        var x = new double[dos.Energies.Length];
        for (int i = 0; i < x.Length; i++) x[i] = dos.Energies[i] - mu;
        LinePlot.Save(path, title + FormattableString.Invariant($" (μ = {mu:0.###} {u})"), "E − μ", u, "DOS", $"states / cell / {u}",
        [
            new LineSeries("total", x, dos.Total),
            new LineSeries("conduction", x, dos.Conduction, Width: 1.5f),
            new LineSeries("correlated", x, dos.Correlated, Width: 1.5f),
        ], verticalLines: [0]);
    }
}
