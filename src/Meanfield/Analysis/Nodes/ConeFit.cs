using Meanfield.Analysis.Dos;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Nodes;

/// <summary>
/// Linear cone of two touching bands: E_pm(q) = w.q +- sqrt(q^T G q) with G = v v^T, fitted from central finite
/// differences (two steps, Richardson-extrapolated). The mean of the bands gives the tilt w, their half difference the
/// cone (Soluyanov et al., Nature 527, 495 (2015) for the tilt criterion). Velocities in energy unit x angstrom.
/// </summary>
public sealed record ConeFit(double[,] Velocity, double[] Singular, double DetVelocity, Vec3 Tilt, double TiltRatio)
{
    /// <summary>
    /// A cone whose velocity determinant is below this fraction of (largest velocity)^dimension is flat in some
    /// direction (a line or plane node, or a quadratic touching): its tilt ratio is reported as infinite.
    /// </summary>
    public const double FlatConeFraction = 1e-14;

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
        // G = sum_a s_a^2 u_a u_a^T: the velocity matrix is its square root sum_a s_a u_a u_a^T (real for a real symmetric
        // G; the eigensolver's vector phases cancel in u u^H).
        var gm = new System.Numerics.Complex[dimension * dimension];
        for (int a = 0; a < dimension; a++) for (int b = 0; b < dimension; b++) gm[a * dimension + b] = g[a, b];
        var values = new double[dimension];
        var vectors = new System.Numerics.Complex[dimension * dimension];
        new HouseholderQlEigensolver(dimension).Solve(gm, values, vectors);
        var s = new double[dimension];
        var velocity = new double[3, 3];
        for (int m = 0; m < dimension; m++)
        {
            s[m] = Math.Sqrt(Math.Max(values[m], 0));
            for (int a = 0; a < dimension; a++)
                for (int b = 0; b < dimension; b++)
                    velocity[a, b] += s[m] * (vectors[a * dimension + m] * System.Numerics.Complex.Conjugate(vectors[b * dimension + m])).Real;
        }
        Array.Sort(s); Array.Reverse(s);
        double det = 1;
        foreach (var x in s) det *= x;
        // Tilt ratio sqrt(w^T G^-1 w) = sqrt(sum_m |u_m^H w|^2 / s_m^2), from the same decomposition; infinite for a cone
        // that is flat in some direction (then some s_m^2 <= 0 and det = 0).
        double ratio = double.PositiveInfinity;
        if (det > FlatConeFraction * Math.Pow(s[0], dimension))
        {
            double q = 0;
            for (int m = 0; m < dimension; m++)
            {
                System.Numerics.Complex projection = 0;
                for (int a = 0; a < dimension; a++) projection += System.Numerics.Complex.Conjugate(vectors[a * dimension + m]) * tilt[a];
                q += (projection * System.Numerics.Complex.Conjugate(projection)).Real / values[m];
            }
            ratio = Math.Sqrt(Math.Max(q, 0));
        }
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
