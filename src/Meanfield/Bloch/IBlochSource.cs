using System.Numerics;
using Meanfield.Binding;
using Meanfield.Lattices;

namespace Meanfield.Bloch;

/// <summary>
/// Anything that yields a Hermitian Bloch matrix H(k) for a model: the bare <see cref="BlochHamiltonian"/> or the
/// mean-field renormalized one. Basis index = orbital * Flavours + flavour, as in <see cref="BoundModel"/>.
/// </summary>
public interface IBlochSource
{
    BoundModel Model { get; }
    int Size { get; }
    /// <summary>Writes H(k) (row-major, Size x Size) for a Cartesian k in inverse angstrom; scratch holds Size*Size.</summary>
    void Assemble(Vec3 k, Span<Complex> h, Span<Complex> scratch);
}
