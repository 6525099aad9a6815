using MathNet.Numerics.Integration;

namespace Meanfield.Heat;

/// <summary>
/// Thermal integrals of a piecewise-linear DOS against Fermi-function kernels at chemical potential mu and temperature T
/// (both in the DOS's energy unit). With x = (E - mu)/T and w(x) = f(1 - f):
/// A_k = Int rho(E) x^k w dE (k = 0, 1, 2), S = Int rho s(x) dE with s = -f ln f - (1-f) ln(1-f),
/// and the thermal part of the electron count dN = Int_{E>mu} rho f dE - Int_{E&lt;mu} rho (1 - f) dE.
/// </summary>
/// <remarks>
/// Only the window |x| &lt; <see cref="WindowHalfWidth"/> contributes (the kernels fall as e^-|x|). The window is cut at the
/// grid points and at mu, and each piece into sub-pieces no wider than T, each integrated by 8-point Gauss-Legendre; so
/// T far below the grid spacing and T far above it are both resolved. Allocation-free.
/// </remarks>
internal static class FermiWindowQuadrature
{
    /// <summary>Window half-width in units of T: e^-45 ~ 3e-20 of the peak is dropped.</summary>
    public const double WindowHalfWidth = 45;

    private static readonly double[] Nodes;
    private static readonly double[] Weights;

    static FermiWindowQuadrature()
    {
        var rule = new GaussLegendreRule(-1, 1, 8);
        Nodes = rule.Abscissas;
        Weights = rule.Weights;
    }

    public readonly record struct Moments(double A0, double A1, double A2, double Entropy, double ThermalCount);

    public static Moments Evaluate(TabulatedDos dos, double mu, double temperature)
    {
        double t = temperature;
        double lo = Math.Max(mu - WindowHalfWidth * t, dos.MinEnergy);
        double hi = Math.Min(mu + WindowHalfWidth * t, dos.MaxEnergy);
        var acc = new Accumulator();
        if (hi <= lo) return default;
        var e = dos.Energies;
        var r = dos.Dos;
        for (int i = dos.Segment(lo); i < e.Length - 1 && e[i] < hi; i++)
        {
            if (r[i] == 0 && r[i + 1] == 0) continue;
            double a = Math.Max(e[i], lo), b = Math.Min(e[i + 1], hi);
            if (b <= a) continue;
            double slope = (r[i + 1] - r[i]) / (e[i + 1] - e[i]);
            if (a < mu && mu < b)
            {
                Piece(ref acc, a, mu, e[i], r[i], slope, mu, t);
                Piece(ref acc, mu, b, e[i], r[i], slope, mu, t);
            }
            else Piece(ref acc, a, b, e[i], r[i], slope, mu, t);
        }
        return new Moments(acc.A0, acc.A1, acc.A2, acc.S, acc.N);
    }

    // ln(1 + y) for 0 <= y <= 1, accurate also when y is far below machine epsilon.
    private static double Log1p(double y) => y < 1e-4 ? y * (1 - y * (0.5 - y / 3)) : Math.Log(1 + y);

    private struct Accumulator { public double A0, A1, A2, S, N; }

    // [a, b] lies on one side of mu and inside one grid segment starting at (e0, r0) with the given slope.
    private static void Piece(ref Accumulator acc, double a, double b, double e0, double r0, double slope,
                              double mu, double t)
    {
        int m = Math.Max(1, (int)Math.Ceiling((b - a) / t));
        double h = (b - a) / m;
        bool above = a + b > 2 * mu;
        for (int p = 0; p < m; p++)
        {
            double c = a + (p + 0.5) * h, half = 0.5 * h;
            for (int q = 0; q < Nodes.Length; q++)
            {
                double energy = c + half * Nodes[q];
                double rho = (r0 + slope * (energy - e0)) * Weights[q] * half;
                double x = (energy - mu) / t;
                double ax = Math.Abs(x);
                double ex = Math.Exp(-ax);
                double small = ex / (1 + ex);            // min(f, 1 - f)
                double w = small / (1 + ex);             // f (1 - f), even in x
                acc.A0 += rho * w;
                acc.A1 += rho * x * w;
                acc.A2 += rho * x * x * w;
                acc.S += rho * (ax * small + Log1p(ex)); // s(x) = |x| min(f,1-f) + ln(1 + e^-|x|)
                acc.N += above ? rho * small : -rho * small;
            }
        }
    }
}
