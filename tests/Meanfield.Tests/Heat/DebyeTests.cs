using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class DebyeTests
{
    // Low-temperature Debye law C = (12 pi^4/5) N R (T/Theta)^3 against the full Debye function
    // 9 N R (T/Theta)^3 Int_0^{Theta/T} x^4 e^x/(e^x-1)^2 dx (Ashcroft & Mermin (1976), ch. 23, eqs. 23.27 and 23.30).
    [Fact]
    public void LowTemperatureLawMatchesFullFunctionAtOneHundredthOfTheta()
    {
        var debye = new Debye(250, 4);
        double t = 2.5;
        double lowT = 12 * Math.Pow(Math.PI, 4) / 5 * 4 * PhysicalConstants.GasConstant * Math.Pow(t / 250, 3);
        Assert.Equal(lowT, debye.LowTemperatureMolarHeat(t), lowT * 1e-12);
        Assert.Equal(lowT, debye.MolarHeat(t), lowT * 1e-9);
        // At Theta/10 the full function is already about 1 % below the T^3 law (common practice: T^3 holds below ~Theta/50).
        Assert.True(debye.MolarHeat(25) < 0.995 * debye.LowTemperatureMolarHeat(25));
    }

    // High-temperature expansion C/(3 N R) = 1 - (1/20)(Theta/T)^2 + (1/560)(Theta/T)^4 - ... (from memory; it follows
    // from expanding x^2/(4 sinh^2(x/2)) = 1 - x^2/12 + x^4/240 under the integral), Dulong-Petit in the limit.
    [Fact]
    public void HighTemperatureApproachesDulongPetit()
    {
        var debye = new Debye(300, 2);
        double u = 0.1; // Theta / T
        double expected = 3 * 2 * PhysicalConstants.GasConstant * (1 - u * u / 20 + Math.Pow(u, 4) / 560);
        Assert.Equal(expected, debye.MolarHeat(3000), expected * 1e-8);
    }
}
