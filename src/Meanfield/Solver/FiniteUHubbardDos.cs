using Meanfield.Heat;
using Meanfield.Lattices;
using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>The paramagnetic finite-U saddle point of a one-band site on a model DOS (see <see cref="FiniteUHubbardDos"/>).</summary>
/// <param name="U">On-site repulsion.</param>
/// <param name="Filling">Site filling n, both spins.</param>
/// <param name="Amplitudes">Bosons e, p, d at the saddle point.</param>
/// <param name="FreeKineticEnergy">e_kin(n): the U = 0 band energy per site, both spins (negative).</param>
/// <param name="Energy">Ground-state energy per site z e_kin + U d^2.</param>
/// <param name="Converged">False when the minimization did not reach its tolerance.</param>
public sealed record FiniteUSolution(double U, double Filling, FourBosonAmplitudes Amplitudes, double FreeKineticEnergy,
                                     double Energy, bool Converged)
{
    /// <summary>Renormalization z of the saddle point.</summary>
    public double Z => Amplitudes.Z;
}

/// <summary>
/// Finite-U Kotliar-Ruckenstein saddle point (PRL 57, 1362 (1986)), paramagnetic, T = 0, for a one-band site whose
/// band is a model DOS of half-width D (flat or semi-elliptic). Every hopping is scaled by q = sqrt(z), so the band
/// rescales rigidly and its energy at fixed filling n is z e_kin(n), e_kin the free band energy per site (both spins).
/// With the constraints solved for e and p (<see cref="FourBosonAmplitudes"/>), the Lagrange multipliers drop out at
/// T = 0 and the saddle point is the minimum over x = d^2 in [max(0, n-1), n/2] of
/// F(x) = z(n, x) e_kin(n) + U x (their Eq. 7 at T = 0; at n = 1 it is the Gutzwiller approximation,
/// Brinkman &amp; Rice, PRB 2, 4302 (1970)).
/// </summary>
public static class FiniteUHubbardDos
{
    /// <summary>Tolerance on x = d^2 (dimensionless, d^2 &lt;= 1) of the bisection on dF/dx.</summary>
    public const double DoubleOccupancyTolerance = 1e-13;

    /// <summary>Solves the saddle point at repulsion U &gt;= 0 and filling 0 &lt; n &lt; 2.</summary>
    /// <exception cref="ArgumentException">Lattice not momentum-free, D &lt;= 0, U &lt; 0 or n outside (0, 2).</exception>
    public static FiniteUSolution Solve(LatticeKind dos, double halfWidth, double u, double filling)
    {
        if (!(u >= 0) || double.IsInfinity(u)) throw new ArgumentException($"U must be finite and >= 0, found {u}");
        if (!(filling > 0 && filling < 2)) throw new ArgumentException($"site filling must lie in (0, 2), found {filling}");
        double ekin = FreeKineticEnergy(dos, halfWidth, filling);
        double lo = FourBosonAmplitudes.MinDouble(filling), hi = FourBosonAmplitudes.MaxDouble(filling);
        double F(double x) => FourBosonAmplitudes.At(filling, x).Z * ekin + u * x;
        // Stationarity dF/dx = e_kin dz/dx + U = 0, with z (1 - n/2)(n/2) = p^2 (e + d)^2 and de/dx = 1/(2e),
        // dd/dx = 1/(2d), dp^2/dx = -1: dz/dx = (e + d)^2 [p^2/(e d) - 1] / [(1 - n/2)(n/2)]. F is convex on
        // [lo, hi] (at n = 1 F = 16|e_kin| x^2 + (U - 8|e_kin|) x), so bisection on the sign of dF/dx finds the minimum;
        // bisection rather than a direct search on F keeps x accurate to rounding (F is flat at its minimum).
        double half = 0.5 * filling, den = (1 - half) * half;
        double Slope(double x)
        {
            var b = FourBosonAmplitudes.At(filling, x);
            double ed = b.E * b.D, s2 = (b.E + b.D) * (b.E + b.D);
            double dz = ed > 0 ? s2 * (b.P * b.P / ed - 1) / den : double.PositiveInfinity;
            return ekin * dz + u;
        }
        double a = lo, c = hi;
        int iterations = 0;
        while (c - a > DoubleOccupancyTolerance && iterations++ < 200)
        {
            double m = 0.5 * (a + c), slope = Slope(m);
            if (slope < 0) a = m; else c = m;
        }
        double best = 0.5 * (a + c);
        // Compare with the ends: past the Brinkman-Rice point the minimum sits on x = 0 (z = 0).
        foreach (double end in (ReadOnlySpan<double>)[lo, hi]) if (F(end) <= F(best)) best = end;
        bool converged = c - a <= DoubleOccupancyTolerance;
        var amps = FourBosonAmplitudes.At(filling, best);
        return new FiniteUSolution(u, filling, amps, ekin, F(best), converged);
    }

    /// <summary>
    /// Free band energy per site, both spins, at T = 0 and filling n: 2 Int_{-D}^{mu} eps rho(eps) d eps with mu set by
    /// 2 Int_{-D}^{mu} rho = n. Semi-elliptic: eps = D cos(theta), rho d eps = (2/pi) sin^2(theta) d theta.
    /// </summary>
    /// <exception cref="ArgumentException">Not a momentum-free DOS or D &lt;= 0.</exception>
    public static double FreeKineticEnergy(LatticeKind dos, double halfWidth, double filling)
    {
        if (!(halfWidth > 0)) throw new ArgumentException($"DOS half-width must be > 0, found {halfWidth}");
        double perSpin = 0.5 * filling;
        switch (dos)
        {
            case LatticeKind.FlatDos:
            {
                double mu = -halfWidth + 2 * halfWidth * perSpin;
                return 2 * CompositeGaussLegendre.Integrate(e => e / (2 * halfWidth), -halfWidth, mu, 4);
            }
            case LatticeKind.SemiEllipticDos:
            {
                static double Count(double th) => (Math.PI - th + 0.5 * Math.Sin(2 * th)) / Math.PI; // Int_th^pi (2/pi) sin^2
                double a = 0, b = Math.PI;
                for (int i = 0; i < 200 && b - a > 1e-15; i++) { double m = 0.5 * (a + b); if (Count(m) > perSpin) a = m; else b = m; }
                double thetaF = 0.5 * (a + b);
                return 2 * CompositeGaussLegendre.Integrate(th => halfWidth * Math.Cos(th) * (2 / Math.PI) * Math.Sin(th) * Math.Sin(th), thetaF, Math.PI, 16);
            }
            default:
                throw new ArgumentException($"a model DOS (flat or semi-elliptic) is needed, found lattice {dos}");
        }
    }
}
