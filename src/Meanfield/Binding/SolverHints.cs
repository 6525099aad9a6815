namespace Meanfield.Binding;

/// <summary>
/// Optional settings from a model file's [solver] table, kept for the solver (command-line options override them).
/// </summary>
/// <param name="TemperatureText">The temperature as written, for example "2 K" or "0.1".</param>
/// <param name="Temperature">The temperature k_B T in the model's energy unit.</param>
/// <param name="Mesh">k-points per reciprocal axis.</param>
/// <param name="Shifted">Whether the k-mesh is shifted off Gamma (Monkhorst-Pack) rather than Gamma-centred.</param>
/// <param name="Tolerance">Convergence tolerance of the saddle-point equations.</param>
/// <param name="MaxIterations">Largest number of saddle-point iterations.</param>
/// <param name="Symmetry">"auto" (default), "none" or the operations to use, as written; null when not given.</param>
/// <param name="SymmetryLocation">Where <paramref name="Symmetry"/> was written (for errors).</param>
public sealed record SolverHints(string? TemperatureText, double? Temperature, int? Mesh, bool? Shifted,
                                 double? Tolerance, int? MaxIterations, string? Symmetry = null,
                                 Models.SourceLocation? SymmetryLocation = null);
