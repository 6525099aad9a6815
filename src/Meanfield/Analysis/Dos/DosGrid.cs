namespace Meanfield.Analysis.Dos;

/// <summary>
/// Accumulators of a DOS on an energy grid (one per thread, merged at the end). The integrated DOS is kept as the
/// partial fractions inside each simplex plus a step array for the simplices that lie wholly below a grid energy.
/// </summary>
internal sealed class DosGrid
{
    public readonly int Points, Channels;
    public readonly double[] Total, Partial, Steps, Channel;

    public DosGrid(int points, int channels)
    {
        Points = points; Channels = channels;
        Total = new double[points]; Partial = new double[points]; Steps = new double[points + 1];
        Channel = new double[Math.Max(channels, 2) * points];
    }

    public void Add(DosGrid other)
    {
        for (int i = 0; i < Total.Length; i++) Total[i] += other.Total[i];
        for (int i = 0; i < Partial.Length; i++) Partial[i] += other.Partial[i];
        for (int i = 0; i < Steps.Length; i++) Steps[i] += other.Steps[i];
        for (int i = 0; i < Channel.Length; i++) Channel[i] += other.Channel[i];
    }

    /// <summary>Grid index range [first, last] of energies e0 + i step inside [lo, hi], clipped to the grid.</summary>
    public (int First, int Last) Window(double e0, double step, double lo, double hi)
    {
        int first = (int)Math.Max(0, Math.Ceiling((lo - e0) / step));
        int last = (int)Math.Min(Points - 1, Math.Floor((hi - e0) / step));
        return (first, last);
    }

    /// <summary>Adds weight w to the integrated DOS at every grid energy above <paramref name="hi"/>.</summary>
    public void AddStepAbove(double e0, double step, double hi, double w)
    {
        double x = Math.Floor((hi - e0) / step) + 1;
        int i = x < 0 ? 0 : x > Points ? Points : (int)x;
        Steps[i] += w;
    }

    public DensityOfStates ToResult(double[] energies, IReadOnlyList<string> siteNames, string method)
    {
        var integrated = new double[Points];
        double run = 0;
        for (int i = 0; i < Points; i++) { run += Steps[i]; integrated[i] = run + Partial[i]; }
        double[] Slice(int c) => Channel.AsSpan(c * Points, Points).ToArray();
        var sites = new double[Math.Max(0, Channels - 2)][];
        for (int s = 0; s < sites.Length; s++) sites[s] = Slice(2 + s);
        return new DensityOfStates(energies, Total, integrated, Slice(0), Slice(1), sites, siteNames, method);
    }
}
