namespace Meanfield.Renormalization;

/// <summary>
/// Paramagnetic four-boson amplitudes of one N = 2 site at finite U (Kotliar &amp; Ruckenstein, PRL 57, 1362 (1986)):
/// empty e, singly occupied p (equal for both spins), doubly occupied d, with the constraints (their Eqs. 3-4)
/// e^2 + 2 p^2 + d^2 = 1 and n_sigma = p^2 + d^2, so for a site filling n (both spins) p^2 = n/2 - d^2 and
/// e^2 = 1 - n + d^2. The hopping of the correlated orbital is scaled by q = sqrt(z), with (their Eq. 5, the
/// normalization factors chosen so that z = 1 at U = 0)
/// z = (e p + p d)^2 / [(1 - d^2 - p^2)(1 - e^2 - p^2)] = (e p + p d)^2 / [(1 - n/2)(n/2)].
/// </summary>
/// <param name="E">Empty-site amplitude e.</param>
/// <param name="P">Single-occupancy amplitude p per spin.</param>
/// <param name="D">Double-occupancy amplitude d (d^2 is the double occupancy).</param>
public readonly record struct FourBosonAmplitudes(double E, double P, double D)
{
    /// <summary>Site filling n = 2 (p^2 + d^2), both spins.</summary>
    public double Filling => 2 * (P * P + D * D);

    /// <summary>Hopping renormalization z (q = sqrt(z) multiplies each hopping amplitude of the orbital).</summary>
    public double Z
    {
        get
        {
            double half = 0.5 * Filling, num = E * P + P * D;
            double den = (1 - half) * half;
            return den > 0 ? num * num / den : 0;
        }
    }

    /// <summary>Lowest allowed d^2 at filling n (e^2 = 1 - n + d^2 &gt;= 0).</summary>
    public static double MinDouble(double n) => Math.Max(0, n - 1);

    /// <summary>Highest allowed d^2 at filling n (p^2 = n/2 - d^2 &gt;= 0).</summary>
    public static double MaxDouble(double n) => 0.5 * n;

    /// <summary>The amplitudes at filling n (0 &lt; n &lt; 2) and double occupancy d^2, clamped into the allowed range.</summary>
    /// <exception cref="ArgumentOutOfRangeException">n outside (0, 2).</exception>
    public static FourBosonAmplitudes At(double n, double doubleOccupancy)
    {
        if (!(n > 0 && n < 2)) throw new ArgumentOutOfRangeException(nameof(n), n, "site filling must lie in (0, 2)");
        double x = Math.Clamp(doubleOccupancy, MinDouble(n), MaxDouble(n));
        return new FourBosonAmplitudes(Math.Sqrt(Math.Max(0, 1 - n + x)), Math.Sqrt(Math.Max(0, 0.5 * n - x)), Math.Sqrt(x));
    }

    /// <summary>
    /// The amplitudes with p eliminated by completeness, p^2 = (1 - e^2 - d^2)/2, or null outside the physical region
    /// (e, d &gt;= 0, e^2 + d^2 &lt; 1): the parametrization the lattice solver iterates in (ln e, ln d).
    /// </summary>
    public static FourBosonAmplitudes? FromEmptyAndDouble(double e, double d)
    {
        double p2 = 0.5 * (1 - e * e - d * d);
        if (!(e >= 0 && d >= 0 && p2 > 0)) return null;
        return new FourBosonAmplitudes(e, Math.Sqrt(p2), d);
    }

    /// <summary>
    /// The hopping factor q = sqrt(z) = p (e + d) / sqrt((n/2)(1 - n/2)) (Kotliar &amp; Ruckenstein 1986, Eq. 5, paramagnetic)
    /// and its partial derivatives at fixed completeness (p^2 = (1 - e^2 - d^2)/2, n/2 = (1 - e^2 + d^2)/2):
    ///   dq/de = [(e + d) dp/de + p] / s - q (1 - n) (-e) / (2 s^2) with dp/de = -e/(2p), s^2 = (n/2)(1 - n/2),
    /// and the same with d (dp/dd = -d/(2p), d(n/2)/dd = +d). Derived here from Eq. 5.
    /// </summary>
    public (double Q, double DqDe, double DqDd) FactorWithSlopes()
    {
        double h = 0.5 * Filling, s2 = h * (1 - h), s = Math.Sqrt(s2);
        double q = P * (E + D) / s;
        double dpde = -E / (2 * P), dpdd = -D / (2 * P);
        // d(s^2)/de = (1 - 2h) dh/de with dh/de = -e, dh/dd = +d.
        double ds2de = (1 - 2 * h) * -E, ds2dd = (1 - 2 * h) * D;
        double dqde = ((E + D) * dpde + P) / s - 0.5 * q * ds2de / s2;
        double dqdd = ((E + D) * dpdd + P) / s - 0.5 * q * ds2dd / s2;
        return (q, dqde, dqdd);
    }
}
