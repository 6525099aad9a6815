namespace Meanfield.Output;

/// <summary>
/// The default energy window of band and DOS pictures, around the heavy bands: centred on the chemical potential,
/// with a half-width of <see cref="Factor"/> times the distance from mu within which <see cref="Share"/> of the
/// correlated-orbital spectral weight lies (the states along the path weighted by their correlated weight for bands,
/// the correlated DOS for a DOS), clamped to the data. Without correlated weight (or with all of it at mu) the window
/// is the whole data range. The rule is common practice for heavy-fermion band pictures (show a few heavy bandwidths
/// around the Fermi level), made reproducible here.
/// </summary>
public static class PlotWindow
{
    /// <summary>Share of the correlated weight whose distance from mu sets the scale.</summary>
    public const double Share = 0.8;

    /// <summary>Half-width of the window in units of that distance: the heavy states fill the inner quarter.</summary>
    public const double Factor = 4;

    /// <summary>
    /// The window (E − mu, same unit as the inputs) from energies relative to mu and their correlated weights.
    /// </summary>
    /// <param name="energyMinusMu">Energies relative to mu.</param>
    /// <param name="weight">Correlated weight of each energy (states or DOS; negative values count as zero).</param>
    /// <param name="dataLow">Lowest energy of the data relative to mu (the clamp).</param>
    /// <param name="dataHigh">Highest energy of the data relative to mu.</param>
    /// <exception cref="ArgumentException">The two arrays differ in length.</exception>
    public static (double Low, double High) AroundMu(double[] energyMinusMu, double[] weight, double dataLow, double dataHigh)
    {
        if (energyMinusMu.Length != weight.Length) throw new ArgumentException($"{energyMinusMu.Length} energies but {weight.Length} weights");
        var distance = new double[energyMinusMu.Length];
        var w = new double[weight.Length];
        double total = 0;
        for (int i = 0; i < distance.Length; i++)
        {
            distance[i] = Math.Abs(energyMinusMu[i]);
            w[i] = weight[i] > 0 && double.IsFinite(weight[i]) ? weight[i] : 0;
            total += w[i];
        }
        if (!(total > 0)) return (dataLow, dataHigh);
        Array.Sort(distance, w);
        double sum = 0, scale = distance[^1];
        for (int i = 0; i < distance.Length; i++)
        {
            sum += w[i];
            if (sum >= Share * total) { scale = distance[i]; break; }
        }
        if (!(scale > 0)) return (dataLow, dataHigh);
        return (Math.Max(dataLow, -Factor * scale), Math.Min(dataHigh, Factor * scale));
    }
}
