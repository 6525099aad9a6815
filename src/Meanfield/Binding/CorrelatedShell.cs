namespace Meanfield.Binding;

/// <summary>
/// The correlated shell f_{s,m}, m = 1..N, of one site: at infinite U with constraint n_b + n_f = Q; at finite U
/// (N = 2 only) the four-boson shell of Kotliar &amp; Ruckenstein, PRL 57, 1362 (1986).
/// </summary>
/// <param name="Orbital">Index of the correlated orbital in <see cref="BoundModel.Orbitals"/>.</param>
/// <param name="Degeneracy">N, the number of flavours of the shell (2 for a Kramers doublet).</param>
/// <param name="Constraint">Q in b^dag b + sum_m f^dag_m f_m = Q (1 for the physical infinite-U model at N = 2).</param>
/// <param name="Level">Bare level eps_f in the model's energy unit.</param>
/// <param name="Group">Shells of the same group share one pair (r, lambda) in the saddle point.</param>
/// <param name="U">On-site repulsion; +infinity (the default) is the infinite-U shell.</param>
public sealed record CorrelatedShell(int Orbital, int Degeneracy, double Constraint, double Level, string Group,
                                     double U = double.PositiveInfinity)
{
    /// <summary>True when U is finite (the four-boson shell).</summary>
    public bool HasFiniteU => !double.IsPositiveInfinity(U);
}
