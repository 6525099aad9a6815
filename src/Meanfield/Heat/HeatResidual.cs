namespace Meanfield.Heat;

/// <summary>One row of a predicted-versus-measured table at a measured temperature. C in J mol^-1 K^-1.</summary>
/// <param name="TemperatureK">Measured temperature (K).</param>
/// <param name="Measured">Measured C (after any phonon subtraction).</param>
/// <param name="Predicted">Predicted C interpolated linearly to this temperature.</param>
public sealed record HeatResidual(double TemperatureK, double Measured, double Predicted)
{
    /// <summary>Measured minus predicted (J mol^-1 K^-1).</summary>
    public double Difference => Measured - Predicted;
    /// <summary>(Measured - predicted) / predicted.</summary>
    public double Relative => Difference / Predicted;
}
