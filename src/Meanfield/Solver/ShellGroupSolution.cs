namespace Meanfield.Solver;

/// <summary>
/// The saddle-point values of one shell group.
/// </summary>
/// <param name="Name">Group name (by default the site name).</param>
/// <param name="Shells">Number of shells (sites) in the group.</param>
/// <param name="R">Boson amplitude r = &lt;b&gt; (dimensionless, r &gt;= 0).</param>
/// <param name="Lambda">Constraint multiplier lambda (energy unit).</param>
/// <param name="BareLevel">Bare shell level eps_f (energy unit).</param>
/// <param name="RenormalizedLevel">eps_f + lambda - mu: the heavy level measured from the chemical potential (energy unit).</param>
/// <param name="FOccupation">n_f per shell (all N components together).</param>
public sealed record ShellGroupSolution(string Name, int Shells, double R, double Lambda, double BareLevel,
                                        double RenormalizedLevel, double FOccupation)
{
    /// <summary>Quasiparticle weight z = r^2 of the f component.</summary>
    public double Z => R * R;
}
