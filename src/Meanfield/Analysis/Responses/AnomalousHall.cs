using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Units;

namespace Meanfield.Analysis.Responses;

/// <summary>
/// Intrinsic anomalous Hall conductivity on a grid of chemical potentials and temperatures (rigid bands: the Bloch
/// Hamiltonian is held fixed while mu moves).
/// </summary>
/// <param name="Dimension">3: values in S/cm; 2: values in e^2/h per layer.</param>
/// <param name="ChemicalPotentials">mu values (energy unit).</param>
/// <param name="Temperatures">k_B T values (energy unit).</param>
/// <param name="Conductivity">[iT, iMu]: the pseudovector (sigma_yz, sigma_zx, sigma_xy) in <see cref="Unit"/>.</param>
/// <param name="Unit">"S/cm" (3D) or "e^2/h" (2D, per layer).</param>
/// <param name="LayerSpacing">2D: the length |a3| (angstrom) that turns a per-layer value into S/cm for a stack; 0 in 3D.</param>
/// <param name="Samples">The zone sampling used.</param>
public sealed record HallResult(int Dimension, IReadOnlyList<double> ChemicalPotentials, IReadOnlyList<double> Temperatures,
                                Vec3[,] Conductivity, string Unit, double LayerSpacing, CurvatureSamples Samples)
{
    /// <summary>A 2D value in e^2/h per layer as S/cm for layers <see cref="LayerSpacing"/> apart (0 in 3D).</summary>
    public double StackedSiemensPerCentimetre(double perLayer) =>
        Dimension == 2 ? perLayer * ResponseUnits.ConductanceQuantum / (LayerSpacing * ResponseUnits.CentimetresPerAngstrom) : 0;
}

/// <summary>
/// sigma_ab = -(e^2/hbar) Int d^dk/(2 pi)^d sum_n f(E_n - mu) Omega_n^ab, the intrinsic anomalous Hall conductivity
/// (Xiao, Chang &amp; Niu, Rev. Mod. Phys. 82, 1959 (2010), Eq. 3.13, with this sign for a current of electrons of
/// charge -e, so that a filled band of Chern number C gives sigma_xy = -C e^2/h and a massive 2D Dirac cone with the
/// lower band full gives -sign(m) e^2/(2h)). Needs broken time reversal (for example a Zeeman field): with time reversal
/// Omega_n(-k) = -Omega_n(k) and sigma vanishes.
/// </summary>
public static class AnomalousHall
{
    /// <summary>Samples the zone, then evaluates sigma on the grid.</summary>
    /// <exception cref="ArgumentException">A lattice without momentum, or empty grids.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A negative temperature.</exception>
    /// <exception cref="RequestError">An invalid mesh, one too large to sample, or a non-finite chemical potential.</exception>
    public static HallResult Compute(IBlochSource source, IReadOnlyList<double> mu, IReadOnlyList<double> temperatures, ResponseMesh mesh) =>
        FromSamples(CurvatureSamples.Compute(source, mesh), mu, temperatures);

    /// <summary>Evaluates sigma on the grid from precomputed samples.</summary>
    /// <exception cref="ArgumentException">Empty grids.</exception>
    /// <exception cref="ArgumentOutOfRangeException">A negative or non-finite temperature.</exception>
    /// <exception cref="RequestError">A non-finite chemical potential.</exception>
    public static HallResult FromSamples(CurvatureSamples s, IReadOnlyList<double> mu, IReadOnlyList<double> temperatures)
    {
        ResponseUnits.CheckGrid(mu, temperatures, allowZeroTemperature: true);
        var lattice = s.Lattice;
        int dim = lattice.Dimension, nb = s.Bands;
        double area = lattice.CellVolume / lattice.A3.Norm;
        // 3D: -(e^2/hbar) (1/V) sum w f Omega [1/angstrom] -> S/cm; 2D: -(2 pi / A) sum w f Omega in units of e^2/h.
        double factor = dim == 3
            ? -ResponseUnits.ConductanceQuantum / lattice.CellVolume / ResponseUnits.CentimetresPerAngstrom
            : -2 * Math.PI / area;
        var result = new Vec3[temperatures.Count, mu.Count];
        Parallel.For(0, temperatures.Count * mu.Count, job =>
        {
            int it = job / mu.Count, im = job % mu.Count;
            double t = temperatures[it], m = mu[im], sx = 0, sy = 0, sz = 0;
            for (int k = 0; k < s.Count; k++)
            {
                double w = s.Weights[k];
                for (int n = 0; n < nb; n++)
                {
                    int b = k * nb + n;
                    double f = FermiDirac.Occupation(s.Energies[b] - m, t) * w;
                    if (f == 0) continue;
                    sx += f * s.Curvatures[3 * b]; sy += f * s.Curvatures[3 * b + 1]; sz += f * s.Curvatures[3 * b + 2];
                }
            }
            result[it, im] = factor * new Vec3(sx, sy, sz);
        });
        return new HallResult(dim, mu.ToArray(), temperatures.ToArray(), result, dim == 3 ? "S/cm" : "e^2/h",
                              dim == 2 ? lattice.A3.Norm : 0, s);
    }
}
