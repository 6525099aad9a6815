using Meanfield.Solver;

namespace Meanfield.Cli;

/// <summary>The saddle point did not converge; carries the attempt for the message (exit code 3).</summary>
public sealed class NotConvergedException(SaddlePoint attempt)
    : Exception($"the saddle point did not converge after {attempt.Iterations} iterations (residual {attempt.ResidualNorm:G3}). {string.Join(" ", attempt.Notes)}")
{
    /// <summary>The best attempt the solver returned.</summary>
    public SaddlePoint Attempt { get; } = attempt;
}
