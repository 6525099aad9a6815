using MathNet.Numerics.Integration;

namespace Meanfield.Heat;

/// <summary>Composite 10-point Gauss-Legendre quadrature on equal pieces: the kernel for smooth thermal integrands.</summary>
public static class CompositeGaussLegendre
{
    private static readonly double[] Nodes;
    private static readonly double[] Weights;

    static CompositeGaussLegendre()
    {
        var rule = new GaussLegendreRule(-1, 1, 10);
        Nodes = rule.Abscissas;
        Weights = rule.Weights;
    }

    /// <summary>Int_a^b g(x) dx using <paramref name="pieces"/> equal sub-intervals.</summary>
    public static double Integrate(Func<double, double> g, double a, double b, int pieces)
    {
        if (pieces < 1) throw new ArgumentOutOfRangeException(nameof(pieces));
        double h = (b - a) / pieces, sum = 0;
        for (int p = 0; p < pieces; p++)
        {
            double c = a + (p + 0.5) * h;
            for (int q = 0; q < Nodes.Length; q++) sum += Weights[q] * g(c + 0.5 * h * Nodes[q]);
        }
        return 0.5 * h * sum;
    }
}
