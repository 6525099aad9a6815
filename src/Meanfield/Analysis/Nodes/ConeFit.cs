using MathNet.Numerics.LinearAlgebra;
using Meanfield.Analysis.Dos;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Nodes;

/// <summary>
/// Linear cone of two touching bands: E_pm(q) = w.q +- sqrt(q^T G q) with G = v v^T, fitted from central finite
/// differences (two steps, Richardson-extrapolated). The mean of the bands gives the tilt w, their half difference the
/// cone (Soluyanov et al., Nature 527, 495 (2015) for the tilt criterion). Velocities in energy unit x angstrom.
/// </summary>
public sealed record ConeFit(double[,] Velocity, double[] Singular, double DetVelocity, Vec3 Tilt, double TiltRatio)
{
    /// <summary>Type II when the tilt overwhelms the cone in some direction: w^T G^-1 w &gt; 1.</summary>
    public bool IsTypeII => TiltRatio > 1;

    /// <summary>Fits the cone of bands lower and lower + 1 at k (Cartesian) with step h (inverse angstrom).</summary>
    public static ConeFit Compute(BlochWorkspace ws, Vec3 k, int lower, double h, int dimension)
    {
        Vec3[] axes = [new(1, 0, 0), new(0, 1, 0), new(0, 0, 1)];
        var g = new double[3, 3];
        var tilt = new double[3];
        for (int i = 0; i < dimension; i++)
        {
            var (c, w) = Directional(ws, k, axes[i], lower, h);
            g[i, i] = c * c; tilt[i] = w;
        }
        for (int i = 0; i < dimension; i++)
            for (int j = i + 1; j < dimension; j++)
            {
                var (c, _) = Directional(ws, k, (axes[i] + axes[j]) / Math.Sqrt(2), lower, h);
                // c^2 = (G_ii + G_jj + 2 G_ij) / 2 along (e_i + e_j)/sqrt 2.
                g[i, j] = g[j, i] = c * c - 0.5 * (g[i, i] + g[j, j]);
            }
        var G = Matrix<double>.Build.DenseOfArray(g).SubMatrix(0, dimension, 0, dimension);
        var evd = G.Evd(Symmetricity.Symmetric);
        var s = new double[dimension];
        var root = Matrix<double>.Build.Dense(dimension, dimension);
        for (int a = 0; a < dimension; a++)
        {
            s[a] = Math.Sqrt(Math.Max(evd.EigenValues[a].Real, 0));
            var vec = evd.EigenVectors.Column(a);
            root += s[a] * vec.OuterProduct(vec);
        }
        Array.Sort(s); Array.Reverse(s);
        double det = 1;
        foreach (var x in s) det *= x;
        var velocity = new double[3, 3];
        for (int a = 0; a < dimension; a++) for (int b = 0; b < dimension; b++) velocity[a, b] = root[a, b];
        var wv = Vector<double>.Build.DenseOfArray(tilt[..dimension]);
        double ratio = det > 1e-14 * Math.Pow(s[0], dimension) ? Math.Sqrt(Math.Max(wv * G.Solve(wv), 0)) : double.PositiveInfinity;
        return new ConeFit(velocity, s, det, new Vec3(tilt[0], tilt[1], tilt[2]), ratio);
    }

    // Slope of the half-difference (cone) and of the mean (tilt) along a unit direction, Richardson on steps h and 2h.
    private static (double Cone, double Tilt) Directional(BlochWorkspace ws, Vec3 k, Vec3 dir, int lower, double h)
    {
        var (c1, w1) = Raw(ws, k, dir, lower, h);
        var (c2, w2) = Raw(ws, k, dir, lower, 2 * h);
        return (2 * c1 - c2, (4 * w1 - w2) / 3);
    }

    private static (double, double) Raw(BlochWorkspace ws, Vec3 k, Vec3 dir, int lower, double h)
    {
        ws.Solve(k + h * dir, false);
        double lp = ws.Values[lower], up = ws.Values[lower + 1];
        ws.Solve(k - h * dir, false);
        double lm = ws.Values[lower], um = ws.Values[lower + 1];
        // The cone is even in q: average both sides; the mean band is odd to first order.
        double cone = ((up - lp) + (um - lm)) / (4 * h);
        double tilt = ((up + lp) - (um + lm)) / (4 * h);
        return (cone, tilt);
    }
}
