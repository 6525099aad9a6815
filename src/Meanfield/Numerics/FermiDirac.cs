namespace Meanfield.Numerics;

/// <summary>Fermi-Dirac occupation and its companions at temperature T (energy unit, k_B = 1); T = 0 is the step.</summary>
public static class FermiDirac
{
    /// <summary>f(x) = 1 / (e^{x/T} + 1) with x = E - mu; at T = 0, 1 below, 0 above, 1/2 at x = 0.</summary>
    public static double Occupation(double x, double t)
    {
        if (t <= 0) return x < 0 ? 1.0 : x > 0 ? 0.0 : 0.5;
        double y = x / t;
        if (y > 40) return Math.Exp(-y);
        if (y < -40) return 1.0 - Math.Exp(y);
        return 1.0 / (Math.Exp(y) + 1.0);
    }

    /// <summary>-df/dx = f(1 - f) / T; zero at T = 0 (the delta function is not representable).</summary>
    public static double NegativeDerivative(double x, double t)
    {
        if (t <= 0) return 0.0;
        double y = Math.Abs(x / t);
        if (y > 40) return Math.Exp(-y) / t;
        double e = Math.Exp(-y);
        return e / ((1 + e) * (1 + e) * t);
    }

    /// <summary>Grand potential of one level: -T ln(1 + e^{-x/T}); at T = 0, min(x, 0).</summary>
    public static double GrandPotential(double x, double t)
    {
        if (t <= 0) return Math.Min(x, 0.0);
        double y = x / t;
        return y > 0 ? -t * Math.Log(1 + Math.Exp(-y)) : x - t * Math.Log(1 + Math.Exp(y));
    }
}
