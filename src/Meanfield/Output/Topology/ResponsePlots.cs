using System.Globalization;
using Meanfield.Analysis.Responses;
using Meanfield.Units;

namespace Meanfield.Output.Topology;

/// <summary>
/// Pictures of the response curves against mu - mu0: sigma_xy (and the other nonzero components) per temperature, and
/// the independent dipole components per temperature, in the house style of <see cref="LinePlot"/>.
/// </summary>
public static class ResponsePlots
{
    /// <summary>Curves closer than this fraction of their largest value are drawn as one (below the plot's resolution).</summary>
    public const double MergeTolerance = 1e-3;

    /// <summary>sigma(mu): every component whose largest |value| exceeds 1e-6 of the largest overall, one curve per temperature.</summary>
    public static void SaveHall(HallResult r, string path, string title, double mu0, EnergyUnit unit)
    {
        string[] names = ["σ_yz", "σ_zx", "σ_xy"];
        var series = new List<LineSeries>();
        double max = 0;
        foreach (var v in r.Conductivity) max = Math.Max(max, Math.Max(Math.Abs(v.X), Math.Max(Math.Abs(v.Y), Math.Abs(v.Z))));
        for (int c = 0; c < 3; c++)
            for (int it = 0; it < r.Temperatures.Count; it++)
            {
                var y = Enumerable.Range(0, r.ChemicalPotentials.Count).Select(im => r.Conductivity[it, im][c]).ToArray();
                if (c < 2 && y.Max(Math.Abs) <= 1e-6 * max) continue;
                series.Add(new LineSeries($"{names[c]}, T = {Kelvin(r.Temperatures[it], unit)}", X(r.ChemicalPotentials, mu0), y, c < 2));
            }
        Save(LinePlot.Build(title, "μ − μ₀", unit.Symbol(), "σ", r.Unit, Merge(series), [0], [0]), path);
    }

    /// <summary>D(mu): the components with a nonzero value (above 1e-6 of the largest), one curve per temperature.</summary>
    public static void SaveDipole(DipoleResult r, string path, string title, double mu0, EnergyUnit unit)
    {
        const string axes = "xyz";
        double max = 0;
        foreach (var d in r.Tensor) foreach (var v in d) max = Math.Max(max, Math.Abs(v));
        var series = new List<LineSeries>();
        for (int i = 0; i < 9; i++)
            for (int it = 0; it < r.Temperatures.Count; it++)
            {
                var y = Enumerable.Range(0, r.ChemicalPotentials.Count).Select(im => r.Tensor[it, im][i]).ToArray();
                if (y.Max(Math.Abs) <= 1e-6 * Math.Max(max, 1e-300)) continue;
                series.Add(new LineSeries($"D_{axes[i / 3]}{axes[i % 3]}, T = {Kelvin(r.Temperatures[it], unit)}", X(r.ChemicalPotentials, mu0), y, it > 0));
            }
        Save(LinePlot.Build(title, "μ − μ₀", unit.Symbol(), "D", r.Unit == "1" ? null : r.Unit, Merge(series), [0], [0]), path);
    }

    // The legend goes to the right of the data, which fill the frame.
    private static void Save(ScottPlot.Plot plot, string path)
    {
        plot.ShowLegend(ScottPlot.Edge.Right);
        PlotStyle.Save(plot, path, PlotStyle.Width + 300, PlotStyle.Height);
    }

    // Curves equal within MergeTolerance of the largest value (components tied by symmetry; the adaptive mesh keeps
    // the tie only to its discretization error) are drawn once, labelled "D_xy = D_yz, T = ...", so no curve hides another.
    private static List<LineSeries> Merge(List<LineSeries> series)
    {
        var kept = new List<LineSeries>();
        var names = new List<List<string>>();
        foreach (var s in series)
        {
            double scale = s.Y.Max(Math.Abs);
            int same = kept.FindIndex(k => k.Y.Count == s.Y.Count && Enumerable.Range(0, s.Y.Count).All(i => Math.Abs(k.Y[i] - s.Y[i]) <= MergeTolerance * scale)
                                           && Suffix(k.Label) == Suffix(s.Label));
            if (same < 0) { kept.Add(s); names.Add([Prefix(s.Label)]); }
            else names[same].Add(Prefix(s.Label));
        }
        return kept.Select((k, i) => k with { Label = string.Join(" = ", names[i]) + Suffix(k.Label) }).ToList();
    }

    private static string Prefix(string? label) => label is null ? "" : label.Split(',')[0];
    private static string Suffix(string? label) => label is null || !label.Contains(',') ? "" : label[label.IndexOf(',')..];

    private static double[] X(IReadOnlyList<double> mu, double mu0) => mu.Select(m => m - mu0).ToArray();

    private static string Kelvin(double t, EnergyUnit unit) => (t * unit.Kelvins()).ToString("G3", CultureInfo.InvariantCulture) + " K";
}
