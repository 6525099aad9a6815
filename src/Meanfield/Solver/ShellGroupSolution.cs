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
/// <param name="U">On-site repulsion of the group's shells; +infinity for the infinite-U auxiliary boson.</param>
/// <param name="Bosons">At finite U the four-boson amplitudes e, p, d (then R = q = sqrt(z) of Kotliar &amp; Ruckenstein
/// and Lambda shifts the f level as at infinite U); null at infinite U.</param>
public sealed record ShellGroupSolution(string Name, int Shells, double R, double Lambda, double BareLevel,
                                        double RenormalizedLevel, double FOccupation, double U = double.PositiveInfinity,
                                        Renormalization.FourBosonAmplitudes? Bosons = null)
{
    /// <summary>True for a finite-U (four-boson) group.</summary>
    public bool HasFiniteU => !double.IsPositiveInfinity(U);

    /// <summary>Quasiparticle weight z = r^2 of the f component.</summary>
    public double Z => R * R;
}
