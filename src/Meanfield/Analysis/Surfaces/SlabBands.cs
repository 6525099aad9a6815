using System.Numerics;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// Eigenvalues of a <see cref="Slab"/> along a surface-zone path with each state's weight on the top and the bottom
/// <see cref="FaceDepth"/> principal layers (0..1 each; a bulk state has about FaceDepth / Layers on each face);
/// degenerate levels share their mean weights.
/// </summary>
public sealed class SlabBands
{
    private readonly double[] _e, _top, _bottom;

    public Slab Slab { get; }
    public BandPathSample Path { get; }
    public int Bands { get; }
    public int FaceDepth { get; }
    public double Energy(int k, int n) => _e[k * Bands + n];
    public double Top(int k, int n) => _top[k * Bands + n];
    public double Bottom(int k, int n) => _bottom[k * Bands + n];

    private SlabBands(Slab slab, BandPathSample path, int depth)
    {
        Slab = slab; Path = path; Bands = slab.Size; FaceDepth = depth;
        _e = new double[path.Count * Bands]; _top = new double[_e.Length]; _bottom = new double[_e.Length];
    }

    /// <summary>Default face depth: a fifth of the slab, at least one principal layer.</summary>
    public static int DefaultFaceDepth(int layers) => Math.Max(1, layers / 5);

    /// <summary>Diagonalises the slab at every path point, in parallel over k with per-thread buffers.</summary>
    /// <param name="faceDepth">Principal layers counted as a face (default <see cref="DefaultFaceDepth"/>).</param>
    public static SlabBands Compute(Slab slab, BandPathSample path, int? faceDepth = null)
    {
        int depth = Math.Clamp(faceDepth ?? DefaultFaceDepth(slab.Layers), 1, slab.Layers);
        var r = new SlabBands(slab, path, depth);
        int n = slab.Size;
        Parallel.For(0, path.Count, () => new Worker(slab), (k, _, w) =>
        {
            w.Solve(path.K[k]);
            w.Values.AsSpan().CopyTo(r._e.AsSpan(k * n, n));
            for (int m = 0; m < n; m++)
                (r._top[k * n + m], r._bottom[k * n + m]) = slab.FaceWeights(w.Vectors, m, depth);
            AverageDegenerate(w.Values, r._top.AsSpan(k * n, n), r._bottom.AsSpan(k * n, n));
            return w;
        }, _ => { });
        return r;
    }

    /// <summary>Levels within this fraction of the largest |E| at a k-point are one degenerate level.</summary>
    public const double DegeneracyTolerance = 1e-9;

    // Eigenvectors of a degenerate level are any basis of its subspace, so single-state face weights are arbitrary
    // there (top and bottom states of a symmetric slab mix): give every state the level's mean weights.
    private static void AverageDegenerate(ReadOnlySpan<double> e, Span<double> top, Span<double> bottom)
    {
        double scale = Math.Max(Math.Abs(e[0]), Math.Abs(e[^1])), tol = DegeneracyTolerance * Math.Max(scale, 1e-300);
        for (int m = 0; m < e.Length;)
        {
            int end = m + 1;
            while (end < e.Length && e[end] - e[end - 1] <= tol) end++;
            if (end - m > 1)
            {
                double t = 0, b = 0;
                for (int i = m; i < end; i++) { t += top[i]; b += bottom[i]; }
                for (int i = m; i < end; i++) { top[i] = t / (end - m); bottom[i] = b / (end - m); }
            }
            m = end;
        }
    }

    /// <summary>Per-thread slab eigen-decomposition buffers.</summary>
    public sealed class Worker(Slab slab)
    {
        private readonly IHermitianEigensolver _solver = Eigensolvers.Create(slab.Size);
        private readonly Complex[] _h = new Complex[slab.Size * slab.Size];
        private readonly Slab.Buffers _buffers = new(slab.Cut.BlockSize);
        public double[] Values { get; } = new double[slab.Size];
        public Complex[] Vectors { get; } = new Complex[slab.Size * slab.Size];

        /// <summary>Eigenvalues (ascending) and, unless <paramref name="vectors"/> is false, eigenvectors as columns.</summary>
        public void Solve(Vec3 kPar, bool vectors = true)
        {
            slab.Assemble(kPar, _h, _buffers);
            _solver.Solve(_h, Values, vectors ? Vectors : Span<Complex>.Empty);
        }
    }

    /// <summary>Lowest and highest slab energy (energy unit).</summary>
    public (double Min, double Max) Range() => (_e.Min(), _e.Max());
}
