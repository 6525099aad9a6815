using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// Eigenvalues E_n(k) (energy unit) on every point of a k-mesh and, optionally, the weight of each eigenstate on
/// projection channels: channel 0 = conduction orbitals, 1 = correlated orbitals, 2 + s = site s.
/// Weights are sum_i |psi_{i,n}(k)|^2 over the basis indices of the channel, so the two kind channels add up to 1,
/// as do the site channels. Eigenvectors are not kept (memory: bands x (1 + channels) doubles per k).
/// </summary>
public sealed class MeshSpectrum
{
    public KMesh Mesh { get; }
    public int Bands { get; }
    /// <summary>0 when projections were not computed, else 2 + number of sites.</summary>
    public int Channels { get; }
    public int SiteCount { get; }
    /// <summary>E[k * Bands + n].</summary>
    public double[] Energies { get; }
    /// <summary>Weight[(k * Bands + n) * Channels + c].</summary>
    public double[] Weights { get; }

    private MeshSpectrum(KMesh mesh, int bands, int channels, int sites, int? points = null)
    {
        Mesh = mesh; Bands = bands; Channels = channels; SiteCount = sites;
        Energies = new double[(points ?? mesh.Count) * bands];
        Weights = new double[(points ?? mesh.Count) * bands * channels];
    }

    public double Energy(int k, int band) => Energies[k * Bands + band];

    /// <summary>
    /// Diagonalises <paramref name="source"/> on the irreducible points of <paramref name="wedge"/> only and copies each
    /// result to every mesh point of its orbit: energies are invariant under the operations of H(k), and so are the two
    /// kind channels (conduction, correlated). Site channels are invariant only when no operation exchanges sites, so
    /// with projections and a site-exchanging operation the whole mesh is diagonalised instead. Equals
    /// <see cref="Compute(IBlochSource, KMesh, bool)"/> to round-off (tested).
    /// </summary>
    /// <exception cref="ArgumentException">The wedge was built on another mesh.</exception>
    public static MeshSpectrum Compute(IBlochSource source, SymmetryWedge wedge, bool withProjections)
    {
        var mesh = wedge.Mesh.Mesh;
        if (withProjections && wedge.ExchangesSites) return Compute(source, mesh, withProjections);
        var reps = wedge.Mesh.Representatives.ToArray();
        var part = Compute(source, mesh, withProjections, reps.Length, k => mesh.Cartesian(reps[k]));
        var result = new MeshSpectrum(mesh, part.Bands, part.Channels, part.SiteCount);
        int n = part.Bands, c = part.Channels;
        var irr = wedge.Mesh;
        Parallel.For(0, mesh.Count, k =>
        {
            int w = irr.Locate(k).Wedge;
            part.Energies.AsSpan(w * n, n).CopyTo(result.Energies.AsSpan(k * n, n));
            if (c > 0) part.Weights.AsSpan(w * n * c, n * c).CopyTo(result.Weights.AsSpan(k * n * c, n * c));
        });
        return result;
    }

    /// <summary>Diagonalises the source on every mesh point, in parallel over k with one workspace per thread.</summary>
    public static MeshSpectrum Compute(IBlochSource source, KMesh mesh, bool withProjections) =>
        Compute(source, mesh, withProjections, mesh.Count, mesh.Cartesian);

    private static MeshSpectrum Compute(IBlochSource source, KMesh mesh, bool withProjections, int count, Func<int, Lattices.Vec3> point)
    {
        var model = source.Model;
        int n = source.Size, f = model.Flavours, sites = model.Sites.Count;
        int channels = withProjections ? 2 + sites : 0;
        var result = new MeshSpectrum(mesh, n, channels, sites, count);
        var channelOfKind = new int[n];
        var channelOfSite = new int[n];
        for (int i = 0; i < n; i++)
        {
            var orb = model.Orbitals[i / f];
            channelOfKind[i] = orb.Kind == OrbitalKind.Conduction ? 0 : 1;
            channelOfSite[i] = 2 + orb.Site;
        }
        Parallel.For(0, count, () => new BlochWorkspace(source), (k, _, ws) =>
        {
            ws.Solve(point(k), withProjections);
            ws.Values.AsSpan().CopyTo(result.Energies.AsSpan(k * n, n));
            if (!withProjections) return ws;
            var w = result.Weights.AsSpan(k * n * channels, n * channels);
            for (int m = 0; m < n; m++)
                for (int i = 0; i < n; i++)
                {
                    double p = ws.Vectors[i * n + m].Real * ws.Vectors[i * n + m].Real
                             + ws.Vectors[i * n + m].Imaginary * ws.Vectors[i * n + m].Imaginary;
                    w[m * channels + channelOfKind[i]] += p;
                    w[m * channels + channelOfSite[i]] += p;
                }
            return ws;
        }, _ => { });
        return result;
    }

    /// <summary>Smallest and largest eigenvalue over the mesh.</summary>
    public (double Min, double Max) Range()
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var e in Energies) { if (e < lo) lo = e; if (e > hi) hi = e; }
        return (lo, hi);
    }
}
