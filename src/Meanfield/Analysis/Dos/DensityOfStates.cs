namespace Meanfield.Analysis.Dos;

/// <summary>
/// Density of states per unit cell per energy unit, all bands and flavours counted, on a uniform energy grid.
/// <see cref="Integrated"/> is the number of states per cell below each energy (it reaches the band count above the
/// top of the spectrum). Kind and site projections add up to <see cref="Total"/>.
/// </summary>
public sealed record DensityOfStates(
    double[] Energies,
    double[] Total,
    double[] Integrated,
    double[] Conduction,
    double[] Correlated,
    IReadOnlyList<double[]> BySite,
    IReadOnlyList<string> SiteNames,
    string Method)
{
    /// <summary>Grid spacing (energy unit).</summary>
    public double Step => Energies.Length > 1 ? Energies[1] - Energies[0] : 0;
}

/// <summary>DOS at one energy (states per cell per energy unit): total and the part on correlated / conduction orbitals.</summary>
public readonly record struct DosValue(double Total, double Correlated, double Conduction);
