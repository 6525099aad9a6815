namespace Meanfield.Solver;

/// <summary>
/// A state sum that differentiates its saddle-point sums analytically from the eigenstates of its last
/// <see cref="IStateSum.Fill"/> (first-order perturbation theory; no further diagonalisation).
/// </summary>
public interface ISaddlePointDerivatives
{
    /// <summary>
    /// Derivatives of the per-cell sums n_f,g = Avg sum f(E - mu) w_g and dOmega/dr_g = Avg sum f(E - mu) dE/dr_g with
    /// respect to x = (r_0..r_{G-1}, lambda_0..lambda_{G-1}) at the amplitudes of the last fill, with mu following the
    /// electron count (dmu/dx from N fixed). Row-major 2G x 2G into <paramref name="result"/>: rows (n_f,0.., dOmega/dr_0..),
    /// columns (r_0.., lambda_0..). At T = 0 only for a Fermi level in a gap (no state partially occupied).
    /// </summary>
    /// <returns>False when the eigenvectors of the last fill are not kept (memory) or the fill was energies only.</returns>
    bool TryDerivatives(double mu, double temperature, double[] result);
}
