using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// Per-thread buffers for diagonalising H(k) of one <see cref="IBlochSource"/>: matrix, scratch, eigenvalues
/// (energy unit, ascending) and eigenvectors as columns (vectors[i * n + m] = component i of band m).
/// Create one per thread; <see cref="Solve"/> allocates nothing of its own.
/// </summary>
public sealed class BlochWorkspace
{
    private readonly IBlochSource _source;
    private readonly IHermitianEigensolver _solver;
    private readonly Complex[] _h, _scratch;

    public int Size { get; }
    public double[] Values { get; }
    public Complex[] Vectors { get; }

    public BlochWorkspace(IBlochSource source)
    {
        _source = source; Size = source.Size;
        _solver = Eigensolvers.Create(Size);
        _h = new Complex[Size * Size]; _scratch = new Complex[Size * Size];
        Values = new double[Size]; Vectors = new Complex[Size * Size];
    }

    /// <summary>Diagonalises H(k) for a Cartesian k (inverse angstrom); eigenvectors only when asked.</summary>
    public void Solve(Vec3 k, bool withVectors)
    {
        _source.Assemble(k, _h, _scratch);
        _solver.Solve(_h, Values, withVectors ? Vectors : Span<Complex>.Empty);
    }

    /// <summary>E_{n+1}(k) - E_n(k) for a Cartesian k: the gap between bands n and n + 1 (0-based).</summary>
    public double Gap(Vec3 k, int lowerBand)
    {
        Solve(k, false);
        return Values[lowerBand + 1] - Values[lowerBand];
    }
}
