namespace Meanfield.Numerics;

/// <summary>Small dense real linear systems by Gaussian elimination with partial pivoting (the Newton steps of the solver).</summary>
public static class DenseSolve
{
    /// <summary>Solves A x = b for a row-major n x n A; returns false when A is numerically singular.</summary>
    public static bool TrySolve(double[] a, double[] b, int n, out double[] x)
    {
        var m = (double[])a.Clone();
        x = (double[])b.Clone();
        double scale = 0;
        foreach (var v in m) scale = Math.Max(scale, Math.Abs(v));
        if (scale == 0) return false;
        for (int c = 0; c < n; c++)
        {
            int p = c;
            for (int r = c + 1; r < n; r++) if (Math.Abs(m[r * n + c]) > Math.Abs(m[p * n + c])) p = r;
            if (Math.Abs(m[p * n + c]) < 1e-14 * scale) return false;
            if (p != c)
            {
                for (int j = 0; j < n; j++) (m[c * n + j], m[p * n + j]) = (m[p * n + j], m[c * n + j]);
                (x[c], x[p]) = (x[p], x[c]);
            }
            for (int r = c + 1; r < n; r++)
            {
                double f = m[r * n + c] / m[c * n + c];
                if (f == 0) continue;
                for (int j = c; j < n; j++) m[r * n + j] -= f * m[c * n + j];
                x[r] -= f * x[c];
            }
        }
        for (int r = n - 1; r >= 0; r--)
        {
            double s = x[r];
            for (int j = r + 1; j < n; j++) s -= m[r * n + j] * x[j];
            x[r] = s / m[r * n + r];
        }
        return true;
    }
}
