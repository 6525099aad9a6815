using Meanfield.Units;

namespace Meanfield.Heat;

/// <summary>
/// Debye phonon heat capacity per mole of formula units with <see cref="AtomsPerFormulaUnit"/> atoms and Debye
/// temperature <see cref="DebyeTemperatureK"/> (K): C = 9 N R (T/Theta)^3 Int_0^{Theta/T} x^4 e^x/(e^x-1)^2 dx,
/// tending to (12 pi^4/5) N R (T/Theta)^3 for T &lt;&lt; Theta and to the Dulong-Petit value 3 N R for T &gt;&gt; Theta
/// (Ashcroft &amp; Mermin, Solid State Physics (1976), ch. 23, eqs. 23.26-23.30). R = N_A k_B.
/// </summary>
public sealed record Debye(double DebyeTemperatureK, double AtomsPerFormulaUnit)
{
    /// <summary>Upper limit beyond which the integrand (~x^4 e^-x) no longer adds at double precision.</summary>
    private const double IntegrandCutoff = 60;

    /// <summary>Full Debye C (J mol^-1 K^-1).</summary>
    public double MolarHeat(double temperatureK)
    {
        Validate(temperatureK);
        double y = DebyeTemperatureK / temperatureK;
        return 9 * AtomsPerFormulaUnit * PhysicalConstants.GasConstant * DebyeIntegral(y) / (y * y * y);
    }

    /// <summary>Low-temperature law C = beta T^3 (J mol^-1 K^-1).</summary>
    public double LowTemperatureMolarHeat(double temperatureK)
    {
        Validate(temperatureK);
        return MolarBeta * temperatureK * temperatureK * temperatureK;
    }

    /// <summary>beta = (12 pi^4/5) N R / Theta^3 (J mol^-1 K^-4).</summary>
    public double MolarBeta => 12 * Math.Pow(Math.PI, 4) / 5 * AtomsPerFormulaUnit * PhysicalConstants.GasConstant
                               / (DebyeTemperatureK * DebyeTemperatureK * DebyeTemperatureK);

    /// <summary>Int_0^y x^4 e^x / (e^x - 1)^2 dx, written as x^4 / (4 sinh^2(x/2)) to stay finite at x -> 0.</summary>
    public static double DebyeIntegral(double y)
    {
        if (!(y >= 0)) throw new ArgumentOutOfRangeException(nameof(y));
        double top = Math.Min(y, IntegrandCutoff);
        return CompositeGaussLegendre.Integrate(static x =>
        {
            double s = Math.Sinh(0.5 * x);
            return x * x * x * x / (4 * s * s);
        }, 0, top, Math.Max(1, (int)Math.Ceiling(top)));
    }

    private void Validate(double temperatureK)
    {
        if (!(temperatureK > 0)) throw new ArgumentOutOfRangeException(nameof(temperatureK), "temperature must be positive (K)");
        if (!(DebyeTemperatureK > 0)) throw new ArgumentException("Debye temperature must be positive (K)");
        if (!(AtomsPerFormulaUnit > 0)) throw new ArgumentException("atoms per formula unit must be positive");
    }
}
