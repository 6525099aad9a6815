using MathNet.Numerics.LinearAlgebra;

namespace Meanfield.Heat;

/// <summary>
/// Least-squares straight line y = a + b x, weighted by 1/sigma^2 when sigmas are given (the kernel of the heat fits).
/// With sigmas the covariance is (X^T W X)^-1 (absolute errors); without, it is s^2 (X^T X)^-1 with
/// s^2 = RSS/(n - 2) (Press et al., Numerical Recipes, 3rd ed. (2007), sec. 15.2 and 15.4).
/// </summary>
internal readonly record struct StraightLineFit(double Intercept, double Slope, double InterceptError, double SlopeError,
                                                double Covariance, double ChiSquare, int Points)
{
    public int DegreesOfFreedom => Points - 2;
    public double ReducedChiSquare => ChiSquare / DegreesOfFreedom;

    public static StraightLineFit Fit(IReadOnlyList<double> x, IReadOnlyList<double> y, IReadOnlyList<double>? sigma)
    {
        int n = x.Count;
        if (n < 3) throw new ArgumentException($"a two-parameter fit needs at least 3 points; got {n}");
        var design = Matrix<double>.Build.Dense(n, 2);
        var rhs = Vector<double>.Build.Dense(n);
        for (int i = 0; i < n; i++)
        {
            double w = sigma is null ? 1 : 1 / sigma[i];
            design[i, 0] = w;
            design[i, 1] = w * x[i];
            rhs[i] = w * y[i];
        }
        var p = design.QR().Solve(rhs);
        double chi2 = (design * p - rhs).DotProduct(design * p - rhs);
        var cov = (design.TransposeThisAndMultiply(design)).Inverse();
        if (sigma is null) cov *= chi2 / (n - 2);
        return new StraightLineFit(p[0], p[1], Math.Sqrt(cov[0, 0]), Math.Sqrt(cov[1, 1]), cov[0, 1], chi2, n);
    }
}
