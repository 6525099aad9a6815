namespace Meanfield.Scans;

/// <summary>Solver settings of a scan file's [solver] table; the solver delegate reads them.</summary>
/// <param name="Mesh">k-points per reciprocal direction.</param>
/// <param name="Tolerance">Saddle-point residual tolerance.</param>
/// <param name="MaxIterations">Iteration cap per point.</param>
/// <param name="Shifted">Monkhorst-Pack mesh shifted off Gamma.</param>
public sealed record ScanSolverSettings(int Mesh = 16, double Tolerance = 1e-10, int MaxIterations = 200, bool Shifted = true);

/// <summary>Optional, costlier columns requested by a scan file's [columns] table.</summary>
public sealed record ScanColumnRequest(bool Heat = false, bool Nodes = false, bool Dos = false);
