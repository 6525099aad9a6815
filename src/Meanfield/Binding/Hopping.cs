using Meanfield.Bloch;

namespace Meanfield.Binding;

/// <summary>
/// A one-body bond t c^dag_{From, cell 0} c_{To, cell R} with an F x F flavour matrix; its Hermitian conjugate is implied.
/// Hybridization is a hopping with one correlated end; on-site hybridization has R = 0.
/// </summary>
/// <param name="From">Orbital index of the creation operator (home cell).</param>
/// <param name="To">Orbital index of the annihilation operator (cell R).</param>
/// <param name="R">Lattice vector coordinates (n1, n2, n3) of the cell of <paramref name="To"/>.</param>
/// <param name="Amplitude">Flavour matrix in the model's energy unit.</param>
/// <param name="Source">Where the term came from in the model file (for messages).</param>
public sealed record Hopping(int From, int To, (int N1, int N2, int N3) R, FlavourMatrix Amplitude, string Source);

/// <summary>A Hermitian on-site flavour matrix (on-site energy, staggered potential, Zeeman field) on one orbital.</summary>
public sealed record OnsiteTerm(int Orbital, FlavourMatrix Amplitude, string Source);
