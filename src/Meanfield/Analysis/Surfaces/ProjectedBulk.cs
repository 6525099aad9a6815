using System.Numerics;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// The bulk spectrum projected onto one k_par: eigenvalues of H00 + e^{i phi} H01 + e^{-i phi} H01^dagger for phi
/// over [0, 2 pi), which by Bloch's theorem along the normal are the bulk bands at k_par + kappa n for every kappa
/// (common practice). Used for the projected gap that surface states are counted in.
/// </summary>
public sealed class ProjectedBulk
{
    /// <summary>Phases sampled across the normal direction.</summary>
    public const int Samples = 48;

    private readonly SurfaceCut _cut;
    private readonly IHermitianEigensolver _solver;
    private readonly Complex[] _h00, _h01, _h;
    private readonly double[] _values;

    public ProjectedBulk(SurfaceCut cut)
    {
        _cut = cut;
        int n = cut.BlockSize;
        _solver = Eigensolvers.Create(n);
        _h00 = new Complex[n * n]; _h01 = new Complex[n * n]; _h = new Complex[n * n]; _values = new double[n];
    }

    /// <summary>Eigenvalues (ascending) at k_par and phase phi into <paramref name="values"/> (BlockSize entries).</summary>
    public void Bands(Vec3 kPar, double phi, Span<double> values)
    {
        int n = _cut.BlockSize;
        _cut.Assemble(kPar, _h00, _h01);
        var w = new Complex(Math.Cos(phi), Math.Sin(phi));
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
                _h[i * n + j] = _h00[i * n + j] + w * _h01[i * n + j] + Complex.Conjugate(w * _h01[j * n + i]);
        _solver.Solve(_h, values, Span<Complex>.Empty);
    }

    /// <summary>
    /// Distance from <paramref name="energy"/> to the projected bulk spectrum at k_par: min over bands and over the
    /// normal wave vector of |E_n - energy|, from <see cref="Samples"/> phases with every sampled local minimum refined by
    /// golden-section search within its neighbouring samples (heavy pockets are narrow in the normal direction).
    /// Zero or tiny where bulk states at that energy project onto k_par.
    /// </summary>
    public double Clearance(Vec3 kPar, double energy)
    {
        Span<double> f = stackalloc double[Samples];
        for (int s = 0; s < Samples; s++) f[s] = Distance(kPar, 2 * Math.PI * s / Samples, energy);
        double best = double.PositiveInfinity;
        foreach (var v in f) best = Math.Min(best, v);
        double step = 2 * Math.PI / Samples;
        for (int s = 0; s < Samples; s++)
        {
            // Every sampled local minimum: a heavy pocket or cone is a narrow dip in the normal direction whose bottom
            // can lie far below its neighbouring samples, so none may be skipped.
            if (f[s] > f[(s + 1) % Samples] || f[s] > f[(s + Samples - 1) % Samples]) continue;
            // Golden-section on [phi_s - step, phi_s + step].
            double a = (s - 1) * step, b = (s + 1) * step, g = 0.5 * (Math.Sqrt(5) - 1);
            double c = b - g * (b - a), d = a + g * (b - a), fc = Distance(kPar, c, energy), fd = Distance(kPar, d, energy);
            for (int it = 0; it < 30; it++)
            {
                if (fc < fd) { b = d; d = c; fd = fc; c = b - g * (b - a); fc = Distance(kPar, c, energy); }
                else { a = c; c = d; fc = fd; d = a + g * (b - a); fd = Distance(kPar, d, energy); }
            }
            best = Math.Min(best, Math.Min(fc, fd));
        }
        return best;
    }

    private double Distance(Vec3 kPar, double phi, double energy)
    {
        Bands(kPar, phi, _values);
        double d = double.PositiveInfinity;
        foreach (var v in _values) d = Math.Min(d, Math.Abs(v - energy));
        return d;
    }

    /// <summary>
    /// The projected gap at k_par between the highest of the lowest <paramref name="occupied"/> bands of a principal
    /// layer and the next band: (top of the lower bands, bottom of the upper bands) over all sampled phi. The gap is
    /// open when Upper &gt; Lower.
    /// </summary>
    public (double Lower, double Upper) Gap(Vec3 kPar, int occupied)
    {
        double lower = double.NegativeInfinity, upper = double.PositiveInfinity;
        for (int s = 0; s < Samples; s++)
        {
            Bands(kPar, 2 * Math.PI * s / Samples, _values);
            lower = Math.Max(lower, _values[occupied - 1]);
            upper = Math.Min(upper, _values[occupied]);
        }
        return (lower, upper);
    }
}
