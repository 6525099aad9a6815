using MathNet.Numerics;

namespace Meanfield.Analysis.Dos;

/// <summary>Gaussian-broadened DOS: each state adds w_k exp(-(E - e)^2 / 2 sigma^2) / (sqrt(2 pi) sigma).</summary>
internal static class GaussianAccumulator
{
    public static void Run(MeshSpectrum sp, double e0, double step, double sigma, DosGrid result)
    {
        int bands = sp.Bands, channels = sp.Channels;
        double weight = 1.0 / sp.Mesh.Count, norm = 1 / (Math.Sqrt(2 * Math.PI) * sigma), cut = 8 * sigma;
        var gate = new object();
        Parallel.For(0, sp.Mesh.Count, () => new DosGrid(result.Points, channels), (k, _, grid) =>
        {
            for (int n = 0; n < bands; n++)
            {
                double e = sp.Energies[k * bands + n];
                var (first, last) = grid.Window(e0, step, e - cut, e + cut);
                grid.AddStepAbove(e0, step, e + cut, weight);
                for (int i = first; i <= last; i++)
                {
                    double x = (e0 + i * step - e) / sigma;
                    double g = weight * norm * Math.Exp(-0.5 * x * x);
                    grid.Total[i] += g;
                    grid.Partial[i] += weight * 0.5 * SpecialFunctions.Erfc(-x / Math.Sqrt(2));
                    int w0 = (k * bands + n) * channels;
                    for (int ch = 0; ch < channels; ch++) grid.Channel[ch * result.Points + i] += g * sp.Weights[w0 + ch];
                }
            }
            return grid;
        }, grid => { lock (gate) result.Add(grid); });
    }
}
