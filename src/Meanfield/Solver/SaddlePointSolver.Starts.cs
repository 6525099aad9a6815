namespace Meanfield.Solver;

/// <summary>Where the iteration starts: the half-mesh solution, a given guess, or the built-in guesses.</summary>
public sealed partial class SaddlePointSolver
{
    /// <summary>
    /// On fine meshes (24 divisions and more) with no starting point given, the saddle point of the half mesh: its
    /// amplitudes and its Jacobian (in the mesh-independent variables ln r, lambda/E0) start the fine iteration, which
    /// then needs a few zone passes instead of a dozen. A coarse failure just falls back to the built-in guesses.
    /// </summary>
    private (double[] Start, double[]? Jacobian)? CoarseSeed(CancellationToken ct)
    {
        if (_model.IsMomentumFree || _settings.InitialGuess is not null || _settings.Mesh < 24) return null;
        var coarse = new SaddlePointSolver(_model, _settings with { Mesh = _settings.Mesh / 2, Tolerance = Math.Max(_settings.Tolerance, 1e-8) }, _group, _reuse);
        var sp = coarse.Solve(ct);
        CoarsePasses = coarse._passes + coarse.CoarsePasses;
        if (!sp.Converged || sp.Branch != SaddlePointBranch.Kondo) return null;
        if (_u is not null)
        {
            // The finite-U iteration runs in (e, d, lambda): the coarse bosons seed it.
            var x = new double[3 * G];
            for (int g = 0; g < G; g++)
            {
                if (sp.Groups[g].Bosons is not { } b) return null;
                x[g] = b.E; x[G + g] = b.D; x[2 * G + g] = sp.Groups[g].Lambda;
            }
            return (x, coarse._lastJacobian);
        }
        return (sp.Amplitudes.Pack(), coarse._lastJacobian);
    }

    /// <summary>Zone passes spent on the half-mesh start (each about 1/8 of a fine pass in 3D).</summary>
    public int CoarsePasses { get; private set; }

    /// <summary>The coarse-mesh seed first, if any, then the built-in guesses, each evaluated only when reached.</summary>
    private IEnumerable<double[]> Starts(double[]? seed)
    {
        if (seed is not null) yield return seed;
        foreach (var guess in Guesses()) yield return guess;
    }

    /// <summary>Built-in starting points: a sizeable r with the f level placed at the chemical potential.</summary>
    private IEnumerable<double[]> Guesses()
    {
        if (_u is not null)
        {
            foreach (var x in GuessesFinite()) yield return x;
            yield break;
        }
        if (_settings.InitialGuess is { } guess && guess.GroupCount == G) yield return guess.Pack();
        foreach (var fraction in new[] { 0.5, 0.2, 0.05 })
        {
            var x = new double[2 * G];
            for (int g = 0; g < G; g++) { x[g] = Math.Sqrt(fraction * _groups[g].Q); x[G + g] = -_groups[g].Level; }
            var (_, fill) = Evaluate(x);
            for (int g = 0; g < G; g++) x[G + g] = fill.Mu - _groups[g].Level;
            yield return x;
        }
    }
}
