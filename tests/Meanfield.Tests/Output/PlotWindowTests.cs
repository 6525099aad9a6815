using Meanfield.Analysis.Dos;
using Meanfield.Output;
using Meanfield.Units;

namespace Meanfield.Tests.Output;

public sealed class PlotWindowTests
{
    // Weight spread uniformly over |E - mu| <= 10: the 80 % quantile of the distance is 8 (the quantile of a uniform
    // distribution, common practice), so the window is +-4 * 8 = +-32, clamped to the data.
    [Fact]
    public void Window_is_four_times_the_distance_holding_80_percent_of_the_correlated_weight()
    {
        int n = 2001;
        var e = new double[n]; var w = new double[n];
        for (int i = 0; i < n; i++) { e[i] = -100 + 0.1 * i; w[i] = Math.Abs(e[i]) <= 10 ? 1 : 0; }
        var (lo, hi) = PlotWindow.AroundMu(e, w, -100, 100);
        Assert.Equal(-32, lo, 0.2);
        Assert.Equal(32, hi, 0.2);
        var clamped = PlotWindow.AroundMu(e, w, -20, 100);
        Assert.Equal(-20, clamped.Low);
    }

    [Fact]
    public void Without_correlated_weight_the_window_is_the_data_range()
    {
        Assert.Equal((-5.0, 7.0), PlotWindow.AroundMu([-5, 0, 7], [0, 0, 0], -5, 7));
        Assert.Equal((-5.0, 7.0), PlotWindow.AroundMu([-5, 0, 7], [0, 1, 0], -5, 7));   // all weight at mu: no scale
    }

    [Theory]
    [InlineData(-1000.0, "\u22121000")]
    [InlineData(12345.5, "12345.5")]
    [InlineData(0.25, "0.25")]
    [InlineData(-841.7953399, "\u2212841.795")]
    [InlineData(2.5e7, "2.5E+7")]
    public void Numbers_have_no_thousands_separators(double v, string text) => Assert.Equal(text, PlotStyle.Number(v));

    [Fact]
    public void Dos_picture_is_written_in_every_format()
    {
        var dir = Directory.CreateTempSubdirectory("mf-dosplot-").FullName;
        try
        {
            int n = 201;
            var e = new double[n]; var c = new double[n]; var f = new double[n]; var t = new double[n];
            for (int i = 0; i < n; i++)
            {
                e[i] = -10 + 0.1 * i; c[i] = 0.1; f[i] = Math.Exp(-e[i] * e[i]); t[i] = c[i] + f[i];
            }
            var dos = new DensityOfStates(e, t, new double[n], c, f, [t], ["A"], "test");
            var (lo, hi) = DosPlot.DefaultWindow(dos, 0);
            Assert.True(lo > -10 && hi < 10 && lo < -1 && hi > 1, $"window {lo}..{hi}");
            foreach (var ext in new[] { ".png", ".svg", ".pdf" })
            {
                var path = Path.Combine(dir, "dos" + ext);
                DosPlot.Save(dos, 0, EnergyUnit.MilliElectronVolt, path, "Invented compound: DOS");
                Assert.True(new FileInfo(path).Length > 1000);
            }
        }
        finally { Directory.Delete(dir, true); }
    }
}
