namespace Meanfield.Analysis.Dos;

/// <summary>The simplex loop of the tetrahedron / triangle DOS, parallel over simplices with thread-local grids.</summary>
internal static class TetrahedronAccumulator
{
    public static void Run(MeshSpectrum sp, MeshSimplices simplices, double e0, double step, bool bloechl, DosGrid result)
    {
        int nc = simplices.CornersPerSimplex, bands = sp.Bands, channels = sp.Channels;
        double weight = 1.0 / simplices.Count;
        var gate = new object();
        Parallel.For(0, simplices.Count,
            () => new Local(result.Points, channels),
            (s, _, loc) =>
            {
                var corners = simplices.Corners.AsSpan(s * nc, nc);
                for (int n = 0; n < bands; n++)
                {
                    for (int c = 0; c < nc; c++) { loc.E[c] = sp.Energies[corners[c] * bands + n]; loc.Order[c] = c; }
                    SortCorners(loc.E, loc.Order, nc);
                    var (first, last) = loc.Grid.Window(e0, step, loc.E[0], loc.E[nc - 1]);
                    loc.Grid.AddStepAbove(e0, step, loc.E[nc - 1], weight);
                    for (int i = first; i <= last; i++)
                    {
                        double E = e0 + i * step;
                        double D, frac;
                        if (nc == 4)
                        {
                            D = SimplexKernel.TetraCornerWeights(loc.E, E, loc.G, bloechl);
                            frac = SimplexKernel.TetraFraction(loc.E, E);
                        }
                        else
                        {
                            D = SimplexKernel.TriangleCornerWeights(loc.E, E, loc.G);
                            frac = SimplexKernel.TriangleFraction(loc.E, E);
                        }
                        loc.Grid.Partial[i] += weight * frac;
                        if (D == 0 && !bloechl) continue;
                        loc.Grid.Total[i] += weight * D;
                        for (int c = 0; c < nc; c++)
                        {
                            int w0 = (corners[loc.Order[c]] * bands + n) * channels;
                            double g = weight * loc.G[c];
                            for (int ch = 0; ch < channels; ch++)
                                loc.Grid.Channel[ch * result.Points + i] += g * sp.Weights[w0 + ch];
                        }
                    }
                }
                return loc;
            },
            loc => { lock (gate) result.Add(loc.Grid); });
    }

    private static void SortCorners(double[] e, int[] order, int n)
    {
        for (int i = 1; i < n; i++)
        {
            double v = e[i]; int o = order[i], j = i - 1;
            while (j >= 0 && e[j] > v) { e[j + 1] = e[j]; order[j + 1] = order[j]; j--; }
            e[j + 1] = v; order[j + 1] = o;
        }
    }

    private sealed class Local(int points, int channels)
    {
        public readonly DosGrid Grid = new(points, channels);
        public readonly double[] E = new double[4], G = new double[4];
        public readonly int[] Order = new int[4];
    }
}
