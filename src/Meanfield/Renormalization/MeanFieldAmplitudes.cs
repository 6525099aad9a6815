namespace Meanfield.Renormalization;

/// <summary>
/// The mean-field values of the auxiliary bosons: for every shell group g, the condensed amplitude r_g = &lt;b&gt; (real,
/// r_g &gt;= 0 fixes the gauge; z_g = r_g^2 is the quasiparticle weight of the f states) and the constraint multiplier
/// lambda_g (energy unit), which shifts the f level to eps_f + lambda_g.
/// </summary>
public sealed class MeanFieldAmplitudes
{
    private readonly double[] _r, _lambda;

    public MeanFieldAmplitudes(IReadOnlyList<double> r, IReadOnlyList<double> lambda)
    {
        if (r.Count != lambda.Count) throw new ArgumentException("r and lambda need one entry per shell group");
        _r = [.. r]; _lambda = [.. lambda];
    }

    public int GroupCount => _r.Length;
    public ReadOnlySpan<double> R => _r;
    public ReadOnlySpan<double> Lambda => _lambda;

    /// <summary>The bare model: r = 1 and lambda = 0 for every group.</summary>
    public static MeanFieldAmplitudes Bare(int groups)
    {
        var r = new double[groups]; Array.Fill(r, 1.0);
        return new(r, new double[groups]);
    }

    /// <summary>Unknowns packed as (r_0..r_{G-1}, lambda_0..lambda_{G-1}), the order the solver iterates in.</summary>
    public double[] Pack() => [.. _r, .. _lambda];

    public static MeanFieldAmplitudes Unpack(ReadOnlySpan<double> x)
    {
        int g = x.Length / 2;
        var r = new double[g];
        for (int i = 0; i < g; i++) r[i] = Math.Abs(x[i]);
        return new(r, x[g..].ToArray());
    }
}
