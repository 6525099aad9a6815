namespace Meanfield.Scans;

/// <summary>
/// Solves the saddle point at one scan point. <paramref name="warmStart"/> is the result of the previously solved
/// grid neighbour (null for a cold start); its <see cref="ScanPointResult.SolverState"/> is the solver's own payload.
/// A solver that does not converge returns a result with <see cref="ScanPointResult.Converged"/> = false, never throws
/// for that reason; it throws only for bad input, and honours <paramref name="ct"/>.
/// </summary>
public delegate ScanPointResult PointSolver(ScanPoint point, ScanPointResult? warmStart, CancellationToken ct);
