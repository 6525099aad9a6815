namespace Meanfield.Solver;

/// <summary>
/// The energies mu (energy unit) that satisfy the T = 0 electron count N(mu) = N_e. A gap of the (interpolated) bands
/// gives an interval, with mu reported at its middle; every mu inside it gives the same occupations, so a caller may
/// move mu within it (for example onto the node energy of a semimetal). A metal gives a single point
/// (<see cref="Lower"/> = <see cref="Upper"/>).
/// </summary>
/// <param name="Lower">Lowest mu with N(mu) = N_e: the top of the highest occupied band.</param>
/// <param name="Upper">Highest mu with N(mu) = N_e: the bottom of the lowest empty band; at least <paramref name="Lower"/>.</param>
public readonly record struct FermiWindow(double Lower, double Upper)
{
    /// <summary>Upper - Lower (zero for a metal).</summary>
    public double Width => Upper - Lower;

    /// <summary>The middle of the window, where mu is reported.</summary>
    public double Middle => 0.5 * (Lower + Upper);

    /// <summary>True when <paramref name="energy"/> lies in [Lower, Upper].</summary>
    public bool Contains(double energy) => energy >= Lower && energy <= Upper;
}
