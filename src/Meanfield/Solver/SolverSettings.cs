using Meanfield.Renormalization;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>How to solve the saddle point. Energies and the temperature are in the model's energy unit (k_B = 1).</summary>
public sealed record SolverSettings
{
    /// <summary>Temperature T &gt;= 0 in the energy unit.</summary>
    public double Temperature { get; init; }
    /// <summary>
    /// Convergence threshold on the largest residual (default 1e-10, positive): the constraint n_f + r^2 - Q as it is, the
    /// stationarity residual divided by the largest model energy E0 (so a model with every energy scaled converges alike).
    /// </summary>
    public double Tolerance { get; init; } = 1e-10;
    public int MaxIterations { get; init; } = 100;
    /// <summary>k-mesh divisions per reciprocal vector (ignored by momentum-free lattices).</summary>
    public int Mesh { get; init; } = 16;
    /// <summary>Shifted Monkhorst-Pack mesh, which avoids the high-symmetry lines where band touchings sit.</summary>
    public bool Shifted { get; init; } = true;
    /// <summary>Quadrature nodes over the conduction DOS of momentum-free lattices.</summary>
    public int DosNodes { get; init; } = 32768;
    /// <summary>Starting amplitudes (a neighbouring scan point's solution); null for the built-in guesses.</summary>
    public MeanFieldAmplitudes? InitialGuess { get; init; }
    /// <summary>Below this r every group is taken to have collapsed to the decoupled (local-moment) solution.</summary>
    public double CollapseThreshold { get; init; } = 1e-3;
    /// <summary>Symmetry that reduces the k-mesh sums: found from the model (default), none, or named operations.</summary>
    public SymmetryRequest Symmetry { get; init; } = SymmetryRequest.Auto;
    /// <summary>
    /// Newton steps with the analytic Jacobian of the saddle-point sums (default); false: Broyden's method with a
    /// finite-difference Jacobian throughout (which also stays the fallback when a Newton step fails).
    /// </summary>
    public bool AnalyticJacobian { get; init; } = true;

    /// <summary>Checks the ranges of the settings a user can give (command line, [solver] table, scan file).</summary>
    /// <exception cref="RequestError">Temperature, mesh, tolerance or iteration count out of range (named with the value).</exception>
    /// <exception cref="ArgumentException">A DOS quadrature of fewer than 64 nodes.</exception>
    public void Validate()
    {
        if (!(Temperature >= 0) || double.IsInfinity(Temperature)) throw new RequestError($"temperature {Temperature}: must be a finite number >= 0");
        if (Mesh < 2) throw new RequestError($"mesh {Mesh}: must be at least 2 divisions");
        if (!(Tolerance > 0)) throw new RequestError($"tolerance {Tolerance}: must be positive");
        if (MaxIterations < 1) throw new RequestError($"max iterations {MaxIterations}: must be at least 1");
        if (DosNodes < 64) throw new ArgumentException($"DOS quadrature needs at least 64 nodes, got {DosNodes}");
    }
}
