namespace Meanfield.Analysis.Nodes;

/// <summary>
/// Derivative-free downhill simplex minimisation (Nelder &amp; Mead, Comput. J. 7, 308 (1965); standard coefficients
/// 1, 2, 1/2, 1/2). Suited to the gap between two bands, which is cone-shaped (not smooth) at a touching point.
/// </summary>
public static class NelderMead
{
    /// <summary>Minimises f from x0 with initial simplex edge <paramref name="step"/>; stops when f &lt; fTarget,
    /// the simplex is smaller than <paramref name="xTolerance"/>, or after maxEvaluations. Returns the best point.</summary>
    public static (double[] X, double F) Minimise(Func<double[], double> f, double[] x0, double step, double fTarget,
                                                  double xTolerance, int maxEvaluations)
    {
        int d = x0.Length;
        var pts = new double[d + 1][];
        var val = new double[d + 1];
        for (int i = 0; i <= d; i++)
        {
            pts[i] = (double[])x0.Clone();
            if (i > 0) pts[i][i - 1] += step;
            val[i] = f(pts[i]);
        }
        int evals = d + 1;
        var centroid = new double[d];
        var trial = new double[d];
        var trial2 = new double[d];
        while (evals < maxEvaluations)
        {
            Array.Sort(val, pts);
            if (val[0] < fTarget || Size(pts) < xTolerance) break;
            Array.Clear(centroid);
            for (int i = 0; i < d; i++) for (int j = 0; j < d; j++) centroid[j] += pts[i][j] / d;
            Along(centroid, pts[d], -1, trial);
            double fr = f(trial); evals++;
            if (fr < val[0])
            {
                Along(centroid, pts[d], -2, trial2);
                double fe = f(trial2); evals++;
                if (fe < fr) Accept(pts, val, d, trial2, fe); else Accept(pts, val, d, trial, fr);
            }
            else if (fr < val[d - 1]) Accept(pts, val, d, trial, fr);
            else
            {
                Along(centroid, pts[d], 0.5, trial);
                double fc = f(trial); evals++;
                if (fc < val[d]) Accept(pts, val, d, trial, fc);
                else
                {
                    for (int i = 1; i <= d; i++)
                    {
                        for (int j = 0; j < d; j++) pts[i][j] = pts[0][j] + 0.5 * (pts[i][j] - pts[0][j]);
                        val[i] = f(pts[i]); evals++;
                    }
                }
            }
        }
        Array.Sort(val, pts);
        return (pts[0], val[0]);
    }

    // c + s (p - c): s = -1 reflection, -2 expansion, 1/2 inside contraction.
    private static void Along(double[] c, double[] p, double s, double[] into)
    {
        for (int j = 0; j < c.Length; j++) into[j] = c[j] + s * (p[j] - c[j]);
    }

    private static void Accept(double[][] pts, double[] val, int d, double[] x, double fx)
    {
        x.CopyTo(pts[d], 0); val[d] = fx;
    }

    private static double Size(double[][] pts)
    {
        double m = 0;
        for (int i = 1; i < pts.Length; i++)
            for (int j = 0; j < pts[0].Length; j++) m = Math.Max(m, Math.Abs(pts[i][j] - pts[0][j]));
        return m;
    }
}
