namespace Meanfield.Symmetry;

/// <summary>The verdict on one candidate operation of the lattice (with or without time reversal).</summary>
/// <param name="Name">Operation name (see <see cref="SymmetryOperation.Name"/>).</param>
/// <param name="Kept">Whether the Hamiltonian has it and it keeps every shell group.</param>
/// <param name="Defect">Smallest largest deviation max|H(Sk) - U H(k) U^dag| over the trial transformations, relative to
/// the largest amplitude of the model; +infinity when no site permutation exists.</param>
/// <param name="Reason">Why it was rejected (empty when kept).</param>
public sealed record OperationCheck(string Name, bool Kept, double Defect, string Reason);
