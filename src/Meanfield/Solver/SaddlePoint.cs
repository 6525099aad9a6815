using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>
/// A solution of the infinite-U auxiliary-boson saddle point, or at finite U of the four-boson one (then each group
/// carries its bosons and <see cref="Amplitudes"/> holds r = q), or the best attempt, with <see cref="Converged"/> false.
/// Energies in the model's energy unit, per unit cell.
/// </summary>
public sealed record SaddlePoint
{
    public required bool Converged { get; init; }
    public required int Iterations { get; init; }
    /// <summary>Largest residual of the saddle-point equations at the returned point.</summary>
    public required double ResidualNorm { get; init; }
    public required double Temperature { get; init; }
    /// <summary>Chemical potential mu (energy unit).</summary>
    public required double Mu { get; init; }
    /// <summary>F = Omega_band + sum_s lambda_s (r_s^2 - Q) + mu N_e per cell (energy unit); at finite U
    /// Omega_band + sum_s (U_s d_s^2 - lambda_s n_b,s) + mu N_e.</summary>
    public required double FreeEnergy { get; init; }
    public required double ElectronsPerCell { get; init; }
    public required SaddlePointBranch Branch { get; init; }
    public required IReadOnlyList<ShellGroupSolution> Groups { get; init; }
    public required MeanFieldAmplitudes Amplitudes { get; init; }
    /// <summary>Free energy of the decoupled (r = 0) solution at the same T, when it exists; null otherwise.</summary>
    public double? DecoupledFreeEnergy { get; init; }
    public required FermiLevelStatus FermiLevel { get; init; }
    /// <summary>
    /// At T = 0, every mu with N(mu) = N_e: on a k-mesh the gap of the tetrahedron-interpolated bands (mu at its middle,
    /// the occupations unchanged anywhere inside), a single point for a metal. Null at T &gt; 0.
    /// </summary>
    public FermiWindow? FermiWindow { get; init; }
    /// <summary>How the zone was sampled (mesh or DOS quadrature) and how occupations were smeared.</summary>
    public required string Sampling { get; init; }
    /// <summary>Plain-language notes for the user: why it did not converge and what to try, or caveats.</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];
    public double WallSeconds { get; init; }
    /// <summary>Number of full passes over the zone (each a diagonalisation of every k-point).</summary>
    public int ZonePasses { get; init; }
    /// <summary>The symmetry that reduced the zone sums, or null for momentum-free lattices.</summary>
    public MeshReduction? Symmetry { get; init; }
    /// <summary>The solve's last pass over the k-mesh when it was made at <see cref="Amplitudes"/> (null otherwise).</summary>
    public ZonePass? FinalPass { get; init; }
}
