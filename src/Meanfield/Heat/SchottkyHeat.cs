namespace Meanfield.Heat;

/// <summary>
/// Schottky anomaly of two levels of equal degeneracy split by Delta: C/(N k_B) = (Delta/T)^2 e^{Delta/T}/(1 + e^{Delta/T})^2
/// (Gopal, Specific Heats at Low Temperatures (1966), ch. 3). Delta and T in the same unit; result per two-level system in k_B.
/// </summary>
public static class SchottkyHeat
{
    public static double PerSystem(double splitting, double temperature)
    {
        if (!(temperature > 0)) throw new ArgumentOutOfRangeException(nameof(temperature));
        double y = Math.Abs(splitting) / temperature;
        double e = Math.Exp(-y);            // written with e^-y to avoid overflow at low T
        return y * y * e / ((1 + e) * (1 + e));
    }
}
