using Meanfield.Analysis.Dos;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>Picture of a DOS: total, conduction and correlated curves against energy, a dashed line at mu.</summary>
public static class DosPlot
{
    public static void Save(DensityOfStates dos, double mu, EnergyUnit unit, string path, string title)
    {
        var u = unit.Symbol();
        LinePlot.Save(path, title, "Energy", u, "DOS", $"states / cell / {u}",
        [
            new LineSeries("total", dos.Energies, dos.Total),
            new LineSeries("conduction", dos.Energies, dos.Conduction, Width: 1.5f),
            new LineSeries("correlated", dos.Energies, dos.Correlated, Width: 1.5f),
        ], verticalLines: [mu]);
    }
}
