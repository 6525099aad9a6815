using System.Numerics;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// A finite stack of <see cref="Layers"/> principal layers of a <see cref="SurfaceCut"/>: the block-tridiagonal
/// H(k_par) with H00 on the diagonal, H01 above it and H01^dagger below it. Layer 0 is the bottom, layer Layers - 1 the
/// top (the termination face). An optional <see cref="SkinPotential"/> acts on the top face, or on both faces
/// (the bottom face counted upwards from its own outermost elementary layer).
/// </summary>
public sealed class Slab
{
    /// <summary>Fewest principal layers of a slab.</summary>
    public const int MinimumLayers = 2;

    public SurfaceCut Cut { get; }
    public int Layers { get; }
    public SkinPotential? Skin { get; }
    public bool SkinOnBothFaces { get; }
    /// <summary>Matrix dimension: Layers x BlockSize.</summary>
    public int Size { get; }

    /// <exception cref="RequestError">Fewer than <see cref="MinimumLayers"/> layers, or an invalid skin potential.</exception>
    public Slab(SurfaceCut cut, int layers, SkinPotential? skin = null, bool skinOnBothFaces = false)
    {
        if (layers < MinimumLayers) throw new RequestError($"--layers {layers}: a slab needs at least {MinimumLayers} principal layers");
        skin?.Validate();
        Cut = cut; Layers = layers; Skin = skin; SkinOnBothFaces = skinOnBothFaces;
        Size = layers * cut.BlockSize;
    }

    /// <summary>Per-thread buffers for <see cref="Assemble"/>.</summary>
    public sealed class Buffers(int block)
    {
        internal readonly Complex[] H00 = new Complex[block * block], H01 = new Complex[block * block];
        internal readonly double[] Diagonal = new double[block];
    }

    /// <summary>Writes the slab H(k_par) (Size x Size, row-major, overwritten) for an in-plane k (inverse angstrom).</summary>
    public void Assemble(Vec3 kPar, Span<Complex> h, Buffers buffers)
    {
        int nb = Cut.BlockSize, n = Size;
        Cut.Assemble(kPar, buffers.H00, buffers.H01);
        h[..(n * n)].Clear();
        for (int p = 0; p < Layers; p++)
        {
            int o = p * nb;
            for (int i = 0; i < nb; i++)
                for (int j = 0; j < nb; j++) h[(o + i) * n + o + j] = buffers.H00[i * nb + j];
            if (p + 1 < Layers)
                for (int i = 0; i < nb; i++)
                    for (int j = 0; j < nb; j++)
                    {
                        var v = buffers.H01[i * nb + j];
                        h[(o + i) * n + o + nb + j] = v;
                        h[(o + nb + j) * n + o + i] = Complex.Conjugate(v);
                    }
        }
        if (Skin is not { } skin) return;
        for (int fromTop = 0; fromTop < Cut.SkinLayers(skin) && fromTop < Layers; fromTop++)
        {
            Cut.SkinDiagonal(skin, fromTop, buffers.Diagonal);
            int o = (Layers - 1 - fromTop) * nb;
            for (int i = 0; i < nb; i++) h[(o + i) * n + o + i] += buffers.Diagonal[i];
            if (!SkinOnBothFaces) continue;
            // The bottom face: the same depth counted upwards, so reverse the sublayers.
            int ob = fromTop * nb, size = Cut.Model.BasisSize, P = Cut.ElementaryLayers;
            for (int q = 0; q < P; q++)
                for (int i = 0; i < size; i++)
                    h[(ob + q * size + i) * n + ob + q * size + i] += buffers.Diagonal[(P - 1 - q) * size + i];
        }
    }

    /// <summary>Weight of eigenvector <paramref name="band"/> (columns of <paramref name="vectors"/>) on the top and
    /// bottom <paramref name="depth"/> principal layers.</summary>
    public (double Top, double Bottom) FaceWeights(ReadOnlySpan<Complex> vectors, int band, int depth)
    {
        int nb = Cut.BlockSize, n = Size, rows = Math.Min(depth, Layers) * nb;
        double top = 0, bottom = 0;
        for (int i = 0; i < rows; i++)
        {
            var b = vectors[i * n + band];
            var t = vectors[(n - 1 - i) * n + band];
            bottom += b.Real * b.Real + b.Imaginary * b.Imaginary;
            top += t.Real * t.Real + t.Imaginary * t.Imaginary;
        }
        return (top, bottom);
    }
}
