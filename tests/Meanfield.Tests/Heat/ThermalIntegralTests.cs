using Meanfield.Heat;

namespace Meanfield.Tests.Heat;

public class ThermalIntegralTests
{
    // Int_{-inf}^{inf} x^4 e^x/(e^x+1)^2 dx = 7 pi^4/15 = 45.45757582: Sommerfeld-type integral (Ashcroft & Mermin,
    // Solid State Physics (1976), app. C). General form Int x^{2n} (-df/dx) dx = 2 (1 - 2^{1-2n}) (2n)! zeta(2n)
    // (from memory): n = 2 gives 2 (7/8) 24 (pi^4/90) = 7 pi^4/15. Recomputed here by quadrature.
    [Fact]
    public void FermiFourthMomentIsSevenPiToTheFourthOverFifteen()
    {
        double integral = CompositeGaussLegendre.Integrate(x =>
        {
            double c = Math.Cosh(0.5 * x);
            return x * x * x * x / (4 * c * c); // e^x/(e^x+1)^2 = 1/(4 cosh^2(x/2))
        }, -80, 80, 320);
        Assert.Equal(7 * Math.Pow(Math.PI, 4) / 15, integral, 1e-9);
        Assert.Equal(45.45757582, integral, 1e-8);
    }

    // Int x^2 (-df/dx) dx = pi^2/3 (Ashcroft & Mermin app. C), the integral behind gamma.
    [Fact]
    public void FermiSecondMomentIsPiSquaredOverThree()
    {
        double integral = CompositeGaussLegendre.Integrate(x =>
        {
            double c = Math.Cosh(0.5 * x);
            return x * x / (4 * c * c);
        }, -80, 80, 320);
        Assert.Equal(Math.PI * Math.PI / 3, integral, 1e-11);
    }

    // Int_0^inf x^4 e^x/(e^x-1)^2 dx = 4 pi^4/15 (Ashcroft & Mermin ch. 23, eq. 23.29 with 4! zeta(4) = 4 pi^4/15).
    [Fact]
    public void DebyeIntegralToInfinityIsFourPiToTheFourthOverFifteen()
    {
        Assert.Equal(4 * Math.Pow(Math.PI, 4) / 15, Debye.DebyeIntegral(500), 1e-10);
        // For small y the integrand is x^2 - x^4/12 + ..., so the integral is y^3/3 - y^5/60 (Taylor series).
        double y = 0.01;
        Assert.Equal(y * y * y / 3 - Math.Pow(y, 5) / 60, Debye.DebyeIntegral(y), 1e-17);
    }
}
