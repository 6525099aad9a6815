using System.Numerics;
using MathNet.Numerics.LinearAlgebra;

namespace Meanfield.Numerics;

/// <summary>
/// Reference eigensolver through MathNet.Numerics' dense EVD (managed or native provider, whichever MathNet has active).
/// It allocates per call: used for cross-checks and as the fallback for large matrices when LAPACK is absent.
/// </summary>
public sealed class MathNetEigensolver(int size) : IHermitianEigensolver
{
    public int Size { get; } = size;

    public void Solve(Span<Complex> matrix, Span<double> values, Span<Complex> vectors)
    {
        int n = Size;
        var m = Matrix<Complex>.Build.Dense(n, n);
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
                m[i, j] = matrix[i * n + j];
        var evd = m.Evd(Symmetricity.Hermitian);
        var ev = evd.EigenValues;
        var order = new int[n];
        for (int i = 0; i < n; i++) order[i] = i;
        Array.Sort(order, (a, b) => ev[a].Real.CompareTo(ev[b].Real));
        for (int c = 0; c < n; c++)
        {
            values[c] = ev[order[c]].Real;
            if (!vectors.IsEmpty)
                for (int i = 0; i < n; i++) vectors[i * n + c] = evd.EigenVectors[i, order[c]];
        }
    }
}
