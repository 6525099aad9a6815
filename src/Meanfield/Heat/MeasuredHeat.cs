namespace Meanfield.Heat;

/// <summary>
/// A measured heat-capacity curve read from a file, with the file line of each point (for error messages) and a note of
/// any phonon term already subtracted. C is molar (J mol^-1 K^-1 per mole of formula units) whatever the file's column.
/// </summary>
/// <param name="Curve">Temperatures (K, ascending) and C (J mol^-1 K^-1).</param>
/// <param name="SourcePath">File the data came from.</param>
/// <param name="Lines">1-based file line of each point, in the curve's order.</param>
/// <param name="Subtracted">Description of subtracted phonon terms; empty for raw data.</param>
public sealed record MeasuredHeat(HeatCurve Curve, string SourcePath, IReadOnlyList<int> Lines, string Subtracted = "");
