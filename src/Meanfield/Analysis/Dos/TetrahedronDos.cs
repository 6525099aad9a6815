using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// Total, integrated and projected DOS of a Bloch source on a Monkhorst-Pack mesh (Gamma-centred or shifted) by the
/// linear tetrahedron method (triangles for 2D lattices) or Gaussian broadening. The mesh is diagonalised once at construction; eigenvalues and
/// per-state projections are kept, eigenvectors are not.
/// </summary>
public sealed class TetrahedronDos
{
    private readonly MeshSimplices? _simplices;

    public MeshSpectrum Spectrum { get; }
    public IReadOnlyList<string> SiteNames { get; }

    public TetrahedronDos(IBlochSource source, KMesh mesh) : this(source, mesh, null) { }

    /// <summary>The DOS on <paramref name="mesh"/>, diagonalising only its irreducible points when a wedge is given.</summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    public TetrahedronDos(IBlochSource source, KMesh mesh, SymmetryWedge? wedge)
    {
        if (mesh.Lattice.Dimension < 2) throw new ArgumentException("The DOS on a mesh needs a lattice with momentum.");
        Spectrum = wedge is not null ? MeshSpectrum.Compute(source, wedge, withProjections: true) : MeshSpectrum.Compute(source, mesh, withProjections: true);
        _simplices = MeshSimplices.Build(mesh);
        SiteNames = source.Model.Sites.Select(s => s.Name).ToArray();
    }

    public DensityOfStates Compute(DosOptions options)
    {
        if (options.Points < 2) throw new ArgumentOutOfRangeException(nameof(options), "DOS needs at least 2 grid points.");
        if (options.Method == DosMethod.Gaussian && !(options.Sigma > 0))
            throw new ArgumentOutOfRangeException(nameof(options), "Gaussian broadening needs sigma > 0.");
        var (lo, hi) = Spectrum.Range();
        double pad = options.Method == DosMethod.Gaussian ? 5 * options.Sigma : 0.05 * Math.Max(hi - lo, 1e-9);
        double e0 = options.Minimum ?? lo - pad, e1 = options.Maximum ?? hi + pad;
        if (!(e1 > e0)) throw new ArgumentException("DOS energy window is empty (maximum <= minimum).");
        int ne = options.Points;
        double step = (e1 - e0) / (ne - 1);
        var grid = new DosGrid(ne, Spectrum.Channels);
        if (options.Method == DosMethod.Gaussian)
            GaussianAccumulator.Run(Spectrum, e0, step, options.Sigma, grid);
        else
        {
            if (_simplices is null) throw new ArgumentException("The tetrahedron method needs a Gamma-centred mesh.");
            TetrahedronAccumulator.Run(Spectrum, _simplices, e0, step, options.BloechlCorrection, grid);
        }
        var energies = new double[ne];
        for (int i = 0; i < ne; i++) energies[i] = e0 + i * step;
        string method = options.Method == DosMethod.Gaussian
            ? $"Gaussian broadening, sigma = {options.Sigma:G6}, mesh {Spectrum.Mesh}"
            : (_simplices!.Dimension == 3 ? "linear tetrahedron method" : "linear triangle method")
              + (options.BloechlCorrection && _simplices.Dimension == 3 ? " with Bloechl corrections" : "")
              + $", mesh {Spectrum.Mesh}";
        return grid.ToResult(energies, SiteNames, method);
    }

    /// <summary>DOS at one energy, for example the Fermi level: total, correlated and conduction parts (tetrahedra).</summary>
    public DosValue DosAtEnergy(double energy, bool bloechl = true)
    {
        if (_simplices is null) throw new InvalidOperationException("The tetrahedron method needs a Gamma-centred mesh.");
        var grid = new DosGrid(1, Spectrum.Channels);
        TetrahedronAccumulator.Run(Spectrum, _simplices, energy, 1.0, bloechl, grid);
        return new DosValue(grid.Total[0], grid.Channel[1], grid.Channel[0]);
    }
}
