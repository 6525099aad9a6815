using Meanfield.Lattices;
using Meanfield.Solutions;

namespace Meanfield.Analysis.Dos;

/// <summary>What DOS to tabulate; energies in the model's unit.</summary>
public sealed record DosRequest
{
    /// <summary>Most energies of one table.</summary>
    public const int MaxEnergies = 2_000_000;
    /// <summary>Default number of steps across the whole band range when no step is given.</summary>
    public const int DefaultStepsAcrossBands = 2000;
    /// <summary>Largest tetrahedron mesh accepted.</summary>
    public const int MaxMesh = 200;

    /// <summary>Tetrahedron k-mesh divisions per reciprocal axis, Gamma-centred, 2..<see cref="MaxMesh"/> (default 24).</summary>
    public int Mesh { get; init; } = 24;
    /// <summary>Energy window (E1, E2) relative to mu; null: the whole band range.</summary>
    public (double Low, double High)? WindowAroundMu { get; init; }
    /// <summary>Energy step; null: the band range / <see cref="DefaultStepsAcrossBands"/>.</summary>
    public double? Step { get; init; }
    /// <summary>Gaussian broadening sigma instead of linear tetrahedra; null: tetrahedra with Bloechl's corrections.</summary>
    public double? GaussianSigma { get; init; }

    /// <summary>Checks what can be checked before a model is solved.</summary>
    /// <exception cref="RequestError">A mesh outside 2..200, a window with E2 &lt;= E1, a step or sigma not positive.</exception>
    public void Validate()
    {
        if (Mesh < 2 || Mesh > MaxMesh) throw new RequestError($"--dos-mesh {Mesh}: use 2..{MaxMesh} divisions");
        if (WindowAroundMu is { } w && !(w.High > w.Low)) throw new RequestError($"--window {w.Low} {w.High}: E2 must exceed E1");
        if (Step is { } s && !(s > 0 && double.IsFinite(s))) throw new RequestError($"--step {s}: must be positive");
        if (GaussianSigma is { } g && !(g > 0 && double.IsFinite(g))) throw new RequestError($"--gaussian {g}: must be positive");
    }
}

/// <summary>A tabulated DOS with its value at mu and what the table can and cannot resolve.</summary>
/// <param name="Dos">Total, kind- and site-resolved DOS on the energy grid.</param>
/// <param name="AtMu">The DOS at the solution's mu (tetrahedra, Bloechl's corrections); for a decoupled solution the conduction part, with Correlated NaN (free moments, not a band).</param>
/// <param name="Mesh">The tetrahedron mesh.</param>
/// <param name="LevelSpacing">Mean level spacing of that mesh: band range / (bands x k-points).</param>
/// <param name="SuggestedMesh">When the step is finer than <paramref name="LevelSpacing"/> (tetrahedra only): a mesh that resolves it; null otherwise.</param>
public sealed record DosStudyResult(DensityOfStates Dos, DosValue AtMu, KMesh Mesh, double LevelSpacing, int? SuggestedMesh);

/// <summary>The one entry point of a DOS table: mesh, energy grid, method and the value at mu.</summary>
public static class DosStudy
{
    /// <summary>Tabulates the DOS of <paramref name="solution"/>.</summary>
    /// <exception cref="RequestError">A momentum-free model, an invalid request, or a step giving fewer than 2 or more than 2,000,000 energies.</exception>
    public static DosStudyResult Run(Solution solution, DosRequest request)
    {
        request.Validate();
        var model = solution.Model;
        if (model.IsMomentumFree) throw new RequestError($"{model.SourcePath}: a momentum-free lattice has an analytic DOS; the tetrahedron DOS needs a lattice with momentum");
        var kmesh = new KMesh(model.Lattice, request.Mesh);
        var tetra = new TetrahedronDos(solution.Hamiltonian, kmesh);
        var (lo, hi) = tetra.Spectrum.Range();
        double width = Math.Max(hi - lo, 1e-12 * Math.Max(1, Math.Abs(lo)));
        double mu = solution.Mu;
        double e0 = request.WindowAroundMu is { } w ? mu + w.Low : lo, e1 = request.WindowAroundMu is { } w1 ? mu + w1.High : hi;
        double h = request.Step ?? width / DosRequest.DefaultStepsAcrossBands;
        long points = (long)Math.Floor((e1 - e0) / h + 1e-9) + 1;
        if (points < 2) throw new RequestError($"--step {h:G6}: wider than the window {e0:G6}..{e1:G6}");
        if (points > DosRequest.MaxEnergies) throw new RequestError($"--step {h:G6}: {points} energies are too many (at most {DosRequest.MaxEnergies})");
        double spacing = width / (tetra.Spectrum.Bands * (double)kmesh.Count);
        int? suggest = request.GaussianSigma is null && h < spacing
            ? (int)Math.Ceiling(Math.Pow(width / (tetra.Spectrum.Bands * h), 1.0 / model.Lattice.Dimension)) : null;
        var dos = tetra.Compute(new DosOptions
        {
            Points = (int)points, Minimum = e0, Maximum = e0 + (points - 1) * h,
            Method = request.GaussianSigma is null ? DosMethod.Tetrahedron : DosMethod.Gaussian, Sigma = request.GaussianSigma ?? 0,
        });
        // Free moments (r = 0) are a flat level at mu, not a band: the DOS at mu is the conduction part, as in the digest.
        var atMu = tetra.DosAtEnergy(mu);
        if (solution.Decoupled)
        {
            var wedge = new global::Meanfield.Symmetry.IrreducibleMesh(kmesh, global::Meanfield.Symmetry.SymmetryGroup.Find(new Bloch.BlochHamiltonian(model)));
            double c = PassDos.DecoupledConductionAt(model, wedge, mu);
            atMu = new DosValue(c, double.NaN, c);
        }
        return new DosStudyResult(dos, atMu, kmesh, spacing, suggest);
    }
}
