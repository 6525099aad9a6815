namespace Meanfield.Heat;

/// <summary>
/// Removes the lattice (phonon) part from measured C to leave the electronic part: either a Debye term or the measured C
/// of a non-magnetic reference compound (common practice).
/// </summary>
public static class PhononSubtraction
{
    /// <summary>C - C_Debye(T) with the full Debye function (Ashcroft &amp; Mermin (1976), ch. 23).</summary>
    public static MeasuredHeat Debye(MeasuredHeat data, double debyeTemperatureK, double atomsPerFormulaUnit)
    {
        var debye = new Debye(debyeTemperatureK, atomsPerFormulaUnit);
        var c = data.Curve.TemperaturesK.Select((t, i) => data.Curve.MolarHeat[i] - debye.MolarHeat(t)).ToArray();
        return data with
        {
            Curve = data.Curve.WithHeat(c),
            Subtracted = Join(data.Subtracted, $"Debye term, Theta_D = {debyeTemperatureK} K, {atomsPerFormulaUnit} atoms per formula unit"),
        };
    }

    /// <summary>
    /// C - C_ref(T), C_ref interpolated linearly in T. The reference must cover every data temperature; otherwise a
    /// <see cref="HeatDataError"/> names the first data line outside it.
    /// </summary>
    public static MeasuredHeat Reference(MeasuredHeat data, MeasuredHeat reference)
    {
        var r = reference.Curve;
        var c = new double[data.Curve.Count];
        for (int i = 0; i < c.Length; i++)
        {
            double t = data.Curve.TemperaturesK[i];
            if (t < r.MinTemperatureK || t > r.MaxTemperatureK)
                throw new HeatDataError(data.SourcePath, data.Lines[i], MeasuredHeatCsv.TemperatureColumn,
                    $"T = {t} K lies outside the reference compound's range [{r.MinTemperatureK}, {r.MaxTemperatureK}] K " +
                    $"({reference.SourcePath})");
            c[i] = data.Curve.MolarHeat[i] - r.At(t);
        }
        return data with
        {
            Curve = data.Curve.WithHeat(c),
            Subtracted = Join(data.Subtracted, $"reference compound {reference.SourcePath}"),
        };
    }

    private static string Join(string a, string b) => a.Length == 0 ? b : a + "; " + b;
}
