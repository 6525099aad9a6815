namespace Meanfield.Scans;

/// <summary>
/// Saddle-point values of one correlated group (one inequivalent correlated site).
/// </summary>
/// <param name="Group">Group name as declared in the model (column suffix).</param>
/// <param name="R">Auxiliary-boson amplitude r (dimensionless; r = 0 is the decoupled local-moment solution).</param>
/// <param name="Lambda">Constraint multiplier lambda (model energy unit).</param>
/// <param name="Nf">Correlated occupation n_f per site of the group (electrons).</param>
public sealed record GroupSolution(string Group, double R, double Lambda, double Nf);
