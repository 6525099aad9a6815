using Meanfield.Binding;

namespace Meanfield.Solver;

/// <summary>
/// T_K^MF of a model at one solver mesh, checked on a finer mesh: the Kondo susceptibility grows like ln(D / k_B T) only
/// while the mesh resolves energies of order k_B T at mu, so a coarse mesh can misplace T_K^MF by tens of percent.
/// </summary>
/// <param name="Result">T_K^MF on the requested mesh (or why it was not found).</param>
/// <param name="Mesh">The requested mesh (null for a momentum-free lattice, which has no mesh).</param>
/// <param name="Check">T_K^MF on the check mesh, or null when there is none (momentum-free lattice, or no T_K^MF on the requested mesh).</param>
/// <param name="CheckMesh">The check mesh: <see cref="KondoScaleStudy.CheckMeshFactor"/> times the requested one.</param>
public sealed record KondoScaleReport(KondoScaleResult Result, int? Mesh, KondoScaleResult? Check, int? CheckMesh)
{
    /// <summary>|T_K(check) - T_K(mesh)| / T_K(check), when both exist.</summary>
    public double? RelativeChange => Result.Temperature is { } a && Check?.Temperature is { } b && b > 0 ? Math.Abs(a - b) / b : null;

    /// <summary>
    /// True when the check mesh confirms the value within <see cref="KondoScaleStudy.MeshAgreement"/>, or there is no
    /// mesh to check; false when the check disagrees or failed.
    /// </summary>
    public bool MeshConverged => Mesh is null || (RelativeChange is { } d && d <= KondoScaleStudy.MeshAgreement);
}

/// <summary>The one entry point of the mean-field Kondo scale: the stability of the decoupled solution, on two meshes.</summary>
public static class KondoScaleStudy
{
    /// <summary>Relative agreement between the requested and the check mesh below which T_K^MF counts as mesh-converged.</summary>
    public const double MeshAgreement = 0.02;

    /// <summary>The check mesh is this factor times the requested one (rounded up).</summary>
    public const double CheckMeshFactor = 1.5;

    /// <summary>
    /// Finds T_K^MF by <see cref="KondoTemperature.FindFromStability"/> from <paramref name="settings"/>' temperature
    /// (1e-3 of the energy unit when it is 0), on the settings' mesh and on the check mesh.
    /// </summary>
    /// <param name="model">The bound model (infinite U).</param>
    /// <param name="settings">Solver settings: mesh, shift, symmetry, starting temperature.</param>
    /// <param name="relativeTolerance">Relative width at which the bisection stops (default 1e-5, positive).</param>
    /// <param name="progress">Told every temperature tried, or null.</param>
    /// <exception cref="RequestError">The model has no correlated shell, or its shells cannot be solved (see <see cref="SaddlePointSolver"/>).</exception>
    public static KondoScaleReport Run(BoundModel model, SolverSettings settings, double relativeTolerance = 1e-5, IProgress<string>? progress = null)
    {
        double t0 = settings.Temperature > 0 ? settings.Temperature : 1e-3;
        KondoScaleResult At(SolverSettings s, IProgress<string>? p) => KondoTemperature.FindFromStability(
            t => new SaddlePointSolver(model, s with { Temperature = t }).DecoupledStability()?.Min() ?? double.NaN, t0, relativeTolerance, progress: p);
        var result = At(settings, progress);
        if (model.IsMomentumFree || result.Temperature is null) return new KondoScaleReport(result, model.IsMomentumFree ? null : settings.Mesh, null, null);
        int check = (int)Math.Ceiling(CheckMeshFactor * settings.Mesh);
        return new KondoScaleReport(result, settings.Mesh, At(settings with { Mesh = check }, null), check);
    }
}
