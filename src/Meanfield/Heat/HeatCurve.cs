namespace Meanfield.Heat;

/// <summary>
/// A heat-capacity curve: molar C (J mol^-1 K^-1, per mole of formula units) at strictly ascending temperatures (K),
/// with optional one-sigma uncertainties of C (same unit).
/// </summary>
public sealed class HeatCurve
{
    private readonly double[] _t, _c;
    private readonly double[]? _sigma;

    public HeatCurve(IReadOnlyList<double> temperaturesK, IReadOnlyList<double> molarHeat,
                     IReadOnlyList<double>? sigma = null)
    {
        if (temperaturesK.Count != molarHeat.Count || (sigma != null && sigma.Count != molarHeat.Count))
            throw new ArgumentException("temperatures, heat capacities and uncertainties must have the same length");
        _t = temperaturesK.ToArray();
        _c = molarHeat.ToArray();
        _sigma = sigma?.ToArray();
        for (int i = 0; i < _t.Length; i++)
        {
            if (!(_t[i] > 0) || !double.IsFinite(_t[i])) throw new ArgumentException($"point {i}: temperature must be positive");
            if (i > 0 && !(_t[i] > _t[i - 1])) throw new ArgumentException($"point {i}: temperatures must be strictly ascending");
            if (!double.IsFinite(_c[i])) throw new ArgumentException($"point {i}: heat capacity must be finite");
            if (_sigma != null && !(_sigma[i] > 0)) throw new ArgumentException($"point {i}: uncertainty must be positive");
        }
    }

    public IReadOnlyList<double> TemperaturesK => _t;
    /// <summary>C in J mol^-1 K^-1.</summary>
    public IReadOnlyList<double> MolarHeat => _c;
    /// <summary>One-sigma uncertainty of C (J mol^-1 K^-1), or null when unknown.</summary>
    public IReadOnlyList<double>? Sigma => _sigma;
    public int Count => _t.Length;
    public double MinTemperatureK => _t[0];
    public double MaxTemperatureK => _t[^1];

    /// <summary>C at <paramref name="temperatureK"/>, linear between points; throws outside the tabulated range.</summary>
    public double At(double temperatureK)
    {
        if (temperatureK < _t[0] || temperatureK > _t[^1])
            throw new ArgumentOutOfRangeException(nameof(temperatureK), temperatureK,
                $"outside the curve's range [{_t[0]}, {_t[^1]}] K");
        int i = Array.BinarySearch(_t, temperatureK);
        if (i >= 0) return _c[i];
        i = ~i - 1;
        double s = (temperatureK - _t[i]) / (_t[i + 1] - _t[i]);
        return _c[i] + s * (_c[i + 1] - _c[i]);
    }

    /// <summary>A copy with C replaced (same temperatures and uncertainties).</summary>
    public HeatCurve WithHeat(IReadOnlyList<double> molarHeat) => new(_t, molarHeat, _sigma);

    /// <summary>A copy with the given one-sigma uncertainties.</summary>
    public HeatCurve WithSigma(IReadOnlyList<double>? sigma) => new(_t, _c, sigma);
}
