namespace Meanfield.Analysis.Dos;

/// <summary>
/// Total density of states per cell per energy unit (all bands and flavours) on a uniform energy grid, with the
/// number of states per cell below each grid energy (<see cref="Integrated"/>, exact for the method's interpolant).
/// </summary>
/// <param name="Energies">Grid energies, ascending (energy unit).</param>
/// <param name="Total">DOS at each energy (states per cell per energy unit).</param>
/// <param name="Integrated">States per cell below each energy.</param>
/// <param name="Method">How it was computed, in words.</param>
public sealed record TotalDensityOfStates(double[] Energies, double[] Total, double[] Integrated, string Method)
{
    /// <summary>Grid spacing (energy unit).</summary>
    public double Step => Energies.Length > 1 ? Energies[1] - Energies[0] : 0;
}

/// <summary>A uniform energy grid: <paramref name="Points"/> energies from <paramref name="Minimum"/> to
/// <paramref name="Maximum"/> inclusive (energy unit; at least 2 points, maximum above minimum).</summary>
public readonly record struct EnergyGrid(double Minimum, double Maximum, int Points)
{
    /// <summary>Spacing of the grid (energy unit).</summary>
    public double Step => (Maximum - Minimum) / (Points - 1);

    /// <summary>Throws <see cref="ArgumentException"/> when the grid is empty or degenerate.</summary>
    public void Validate()
    {
        if (Points < 2) throw new ArgumentException($"an energy grid needs at least 2 points, not {Points}");
        if (!(Maximum > Minimum) || !double.IsFinite(Minimum) || !double.IsFinite(Maximum))
            throw new ArgumentException($"energy grid [{Minimum}, {Maximum}]: need finite minimum < maximum");
    }
}
