using Meanfield.Analysis.Curvature;
using Meanfield.Lattices;
using Meanfield.Output;

namespace Meanfield.Tests.Output;

public sealed class CurvaturePlotTests
{
    // A 60-degree plane (spans of length 1 and 1 at 60 degrees, as in a hexagonal zone): in Cartesian in-plane
    // coordinates it spans x in [0, 1.5] and y in [0, sin 60] (elementary geometry).
    private static BerryCurvatureMap Map(int n, Func<int, int, double> omega)
    {
        var b1 = new Vec3(1, 0, 0); var b2 = new Vec3(0.5, Math.Sqrt(3) / 2, 0);
        var red = new Vec3[n, n]; var cart = new Vec3[n, n]; var om = new double[n, n]; var flux = new double[n, n];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
            {
                double s = (i + 0.5) / n, t = (j + 0.5) / n;
                red[i, j] = new Vec3(s, t, 0); cart[i, j] = s * b1 + t * b2; om[i, j] = omega(i, j);
            }
        return new BerryCurvatureMap(new Vec3(0, 0, 0), new Vec3(1, 0, 0), new Vec3(0, 1, 0), new Vec3(0, 0, 1), n, n,
                                     red, cart, om, flux, 0, false, 1);
    }

    [Fact]
    public void Colour_scale_clips_a_single_spike_and_the_plane_keeps_its_shape()
    {
        var map = Map(10, (i, j) => i == 3 && j == 4 ? 1e6 : (i + j) % 2 == 0 ? 1 : -1);
        Assert.Equal(1, CurvaturePlot.Clip(map));   // one plaquette in 100 lies above the 98th percentile
        var plot = CurvaturePlot.Build(map, [], "Invented compound");
        var limits = plot.Axes.GetLimits();
        Assert.Equal(0, limits.Left, 1e-9);
        Assert.Equal(1.5, limits.Right, 1e-9);
        Assert.Equal(Math.Sqrt(3) / 2, limits.Top, 1e-9);
        Assert.Contains("plane (0, 0, 0)", plot.Axes.Title.Label.Text);
    }
}
