namespace Meanfield.Analysis.Dos;

/// <summary>How the DOS turns eigenvalues on a mesh into a function of energy.</summary>
public enum DosMethod
{
    /// <summary>Linear tetrahedra (triangles in 2D) with Bloechl's corrections to the projections.</summary>
    Tetrahedron,
    /// <summary>Each eigenvalue spread into a normalized Gaussian of width sigma (smears E^2 laws near nodes).</summary>
    Gaussian,
}

/// <summary>Energy grid and method of a DOS. Energies in the model's energy unit.</summary>
public sealed record DosOptions
{
    /// <summary>Number of grid energies (at least 2).</summary>
    public int Points { get; init; } = 1001;
    /// <summary>Lowest grid energy; default: lowest eigenvalue minus 5 % of the spectral range (or 5 sigma).</summary>
    public double? Minimum { get; init; }
    /// <summary>Highest grid energy; default: highest eigenvalue plus the same margin.</summary>
    public double? Maximum { get; init; }
    public DosMethod Method { get; init; } = DosMethod.Tetrahedron;
    /// <summary>Gaussian width (energy unit); used only by <see cref="DosMethod.Gaussian"/>.</summary>
    public double Sigma { get; init; }
    /// <summary>Apply Bloechl's correction to the projected (kind, site) densities; the total is unaffected.</summary>
    public bool BloechlCorrection { get; init; } = true;
}
