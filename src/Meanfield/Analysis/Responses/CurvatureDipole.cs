using Meanfield.Analysis.Symmetry;
using Meanfield.Bloch;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Responses;

/// <summary>
/// Berry curvature dipole on a grid of chemical potentials and temperatures (rigid bands).
/// </summary>
/// <param name="Dimension">3: D dimensionless; 2: D in angstrom (only D_xz, D_yz are nonzero).</param>
/// <param name="ChemicalPotentials">mu values (energy unit).</param>
/// <param name="Temperatures">k_B T values (energy unit), all positive.</param>
/// <param name="Tensor">[iT, iMu]: D_ab row-major (9 numbers, a = derivative direction, b = curvature component).</param>
/// <param name="Unit">"1" (dimensionless, 3D) or "angstrom" (2D).</param>
/// <param name="Samples">The zone sampling used.</param>
/// <param name="PointGroupOrder">Number of point operations found by <see cref="ModelSymmetry.Find"/> (0 when not analysed).</param>
/// <param name="Allowed">Orthonormal basis of the symmetry-allowed tensors (empty: the group forbids D; null: not analysed).</param>
/// <param name="HasInversion">Inversion is a symmetry (then D = 0 identically).</param>
public sealed record DipoleResult(int Dimension, IReadOnlyList<double> ChemicalPotentials, IReadOnlyList<double> Temperatures,
                                  double[,][] Tensor, string Unit, CurvatureSamples Samples,
                                  int PointGroupOrder = 0, IReadOnlyList<double[]>? Allowed = null, bool HasInversion = false)
{
    /// <summary>Components that vanish by symmetry ("xx", ...), or null when not analysed.</summary>
    public IReadOnlyList<string>? Forbidden { get; init; }
}

/// <summary>
/// D_ab = Int d^dk/(2 pi)^d sum_n f_n d_a Omega_n,b (Sodemann &amp; Fu, PRL 115, 216806 (2015), Eq. 3), evaluated in
/// its Fermi-surface form D_ab = Int sum_n (-df/dE) (dE_n/dk_a) Omega_n,b (integration by parts over the periodic
/// zone), which needs k_B T &gt; 0 resolved by the mesh. D is a pseudotensor: an operation g of the crystal gives
/// D = det(g) g D g^T, so inversion forbids it; time reversal allows it (see <see cref="DipoleSymmetry"/>).
/// </summary>
public static class CurvatureDipole
{
    /// <summary>
    /// Samples the zone, evaluates D on the grid and finds the point group of the model with the components it allows.
    /// </summary>
    /// <exception cref="ArgumentException">A lattice without momentum, or empty grids.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A temperature that is not positive.</exception>
    /// <exception cref="RequestError">An invalid mesh, one too large to sample, or a non-finite chemical potential.</exception>
    public static DipoleResult Compute(IBlochSource source, IReadOnlyList<double> mu, IReadOnlyList<double> temperatures, ResponseMesh mesh)
    {
        ResponseUnits.CheckGrid(mu, temperatures, allowZeroTemperature: false);
        var ops = ModelSymmetry.Find(source);
        return FromSamples(CurvatureSamples.Compute(source, mesh), mu, temperatures) with
        {
            PointGroupOrder = ops.Count, Allowed = DipoleSymmetry.AllowedBasis(ops), HasInversion = ops.Any(o => o.IsInversion),
            Forbidden = DipoleSymmetry.ForbiddenComponents(ops),
        };
    }

    /// <summary>Evaluates D on the grid from precomputed samples.</summary>
    /// <exception cref="ArgumentException">Empty grids.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A temperature that is not positive.</exception>
    /// <exception cref="RequestError">A non-finite chemical potential.</exception>
    public static DipoleResult FromSamples(CurvatureSamples s, IReadOnlyList<double> mu, IReadOnlyList<double> temperatures)
    {
        ResponseUnits.CheckGrid(mu, temperatures, allowZeroTemperature: false);
        var lattice = s.Lattice;
        int dim = lattice.Dimension, nb = s.Bands;
        // Int d^dk/(2 pi)^d = (1/cell) x zone average: the volume in 3D, the area in 2D.
        double factor = 1 / (dim == 3 ? lattice.CellVolume : lattice.CellVolume / lattice.A3.Norm);
        var result = new double[temperatures.Count, mu.Count][];
        Parallel.For(0, temperatures.Count * mu.Count, job =>
        {
            int it = job / mu.Count, im = job % mu.Count;
            double t = temperatures[it], m = mu[im];
            var d = new double[9];
            for (int k = 0; k < s.Count; k++)
            {
                double w = s.Weights[k];
                for (int n = 0; n < nb; n++)
                {
                    int b = k * nb + n;
                    double g = FermiDirac.NegativeDerivative(s.Energies[b] - m, t) * w;
                    if (g == 0) continue;
                    for (int a = 0; a < 3; a++)
                    {
                        double va = g * s.Velocities[3 * b + a];
                        for (int c = 0; c < 3; c++) d[a * 3 + c] += va * s.Curvatures[3 * b + c];
                    }
                }
            }
            for (int i = 0; i < 9; i++) d[i] *= factor;
            result[it, im] = d;
        });
        return new DipoleResult(dim, mu.ToArray(), temperatures.ToArray(), result, dim == 3 ? "1" : "angstrom", s);
    }
}
