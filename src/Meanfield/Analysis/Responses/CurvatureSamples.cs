using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Responses;

/// <summary>How the zone is sampled for the Berry-curvature responses.</summary>
public sealed record ResponseMesh
{
    /// <summary>Base Monkhorst-Pack divisions per reciprocal axis (2..256). Default 24.</summary>
    public int Divisions { get; init; } = 24;
    /// <summary>Shifted mesh (points off the high-symmetry planes; default) or Gamma-centred.</summary>
    public bool Shifted { get; init; } = true;
    /// <summary>
    /// Adaptive refinement depth (0..4, default 0): a cell whose curvature flux per face exceeds
    /// <see cref="RefinementFlux"/> is split into 3^d sub-cells, recursively up to this depth.
    /// </summary>
    public int RefinementLevels { get; init; }
    /// <summary>Flux per cell face (radians) above which a cell is refined. Default <see cref="ResponseTolerances.RefinementFlux"/>.</summary>
    public double RefinementFlux { get; init; } = ResponseTolerances.RefinementFlux;
    /// <summary>
    /// Thermal width k_B T (energy unit) the Fermi window must be resolved to, or null: with refinement on, a cell is
    /// also split when a band inside the window changes by more than this across it (|dE/dk| h &gt; k_B T), so the
    /// Fermi-surface integrals (the dipole, sigma of a metal at low T) see a smooth -df/dE.
    /// </summary>
    public double? ThermalWidth { get; init; }
    /// <summary>Only bands with energies in [Min, Max] (energy unit) can trigger refinement; null: every band.</summary>
    public (double Min, double Max)? RefinementWindow { get; init; }

    /// <summary>Checks the ranges.</summary>
    /// <exception cref="RequestError">Divisions or refinement levels outside their range (the --kmesh and --refine options).</exception>
    /// <exception cref="ArgumentOutOfRangeException">A thermal width or refinement flux that is not positive.</exception>
    public void Validate()
    {
        if (Divisions is < 2 or > 256) throw new RequestError($"--kmesh {Divisions}: use 2..256 mesh divisions");
        if (RefinementLevels is < 0 or > 4) throw new RequestError($"--refine {RefinementLevels}: use 0..4 refinement levels");
        if (ThermalWidth is { } kt && !(kt > 0)) throw new ArgumentOutOfRangeException(nameof(ThermalWidth), "the thermal width must be positive");
        if (!(RefinementFlux > 0)) throw new ArgumentOutOfRangeException(nameof(RefinementFlux), "the refinement flux must be positive");
    }

    /// <summary>"24^d shifted, refined x3 up to 2 level(s) above 0.1 rad per face".</summary>
    public override string ToString() =>
        $"{Divisions}^d {(Shifted ? "shifted" : "Gamma-centred")}" + (RefinementLevels > 0 ? $", refined x3 up to {RefinementLevels} level(s) above {RefinementFlux:G3} rad per face"
           + (ThermalWidth is { } kt ? $" or band changes above {kt:G3} per cell" : "") : "");
}

/// <summary>
/// Band energies, velocities and Berry curvatures at weighted k-points covering the zone once (weights sum to 1):
/// the base mesh, with refined cells replaced by their sub-cells. Flat arrays: band n of sample s at s * Bands + n;
/// vectors at (s * Bands + n) * 3 + a.
/// </summary>
public sealed class CurvatureSamples
{
    /// <summary>Bands per k-point.</summary>
    public required int Bands { get; init; }
    /// <summary>Weight of each sample (fraction of the zone; they sum to 1).</summary>
    public required double[] Weights { get; init; }
    /// <summary>E_n (energy unit) at s * Bands + n.</summary>
    public required double[] Energies { get; init; }
    /// <summary>dE_n/dk_a (energy unit x angstrom) at (s * Bands + n) * 3 + a.</summary>
    public required double[] Velocities { get; init; }
    /// <summary>Omega_n along a (square angstrom) at (s * Bands + n) * 3 + a.</summary>
    public required double[] Curvatures { get; init; }
    /// <summary>Base mesh points.</summary>
    public required int BasePoints { get; init; }
    /// <summary>Base cells that were refined (at the first level).</summary>
    public required int RefinedCells { get; init; }
    /// <summary>The sampling settings used.</summary>
    public required ResponseMesh Mesh { get; init; }
    /// <summary>The lattice of the model (cell volume and dimension for the unit conversions).</summary>
    public required Lattice Lattice { get; init; }
    /// <summary>Number of samples.</summary>
    public int Count => Weights.Length;

    /// <summary>Samples the zone of <paramref name="source"/>.</summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    /// <param name="source">The Bloch Hamiltonian.</param>
    /// <param name="mesh">The sampling.</param>
    /// <param name="sampleLimit">Most samples allowed; default: what fits in <see cref="Solver.MeshMemory.UsableFraction"/> of the machine's memory.</param>
    /// <exception cref="RequestError">An invalid <paramref name="mesh"/>, or a refinement that needs more samples than allowed (the message gives the numbers).</exception>
    public static CurvatureSamples Compute(IBlochSource source, ResponseMesh mesh, long? sampleLimit = null)
    {
        mesh.Validate();
        var lattice = source.Model.Lattice;
        int dim = lattice.Dimension;
        if (dim < 2) throw new ArgumentException($"{source.Model.Name}: a lattice without momentum has no Berry curvature.");
        var km = new KMesh(lattice, mesh.Divisions, mesh.Shifted);
        int nb = source.Size, nk = km.Count;
        var velocity = new VelocityOperator(source);
        double w0 = 1.0 / nk;
        var e = new double[nk * nb]; var v = new double[nk * nb * 3]; var o = new double[nk * nb * 3];
        var refine = new bool[nk];
        Vec3 e1 = lattice.B1 / km.N1, e2 = lattice.B2 / km.N2, e3 = dim == 3 ? lattice.B3 / km.N3 : Vec3.Zero;
        double h0 = Math.Max(e1.Norm, Math.Max(e2.Norm, e3.Norm));
        Parallel.For(0, nk, () => new BandGeometry(source, velocity), (k, _, g) =>
        {
            g.Compute(km.Cartesian(k));
            Array.Copy(g.Energies, 0, e, k * nb, nb);
            Array.Copy(g.Velocities, 0, v, k * nb * 3, nb * 3);
            Array.Copy(g.Curvatures, 0, o, k * nb * 3, nb * 3);
            refine[k] = mesh.RefinementLevels > 0 && NeedsRefinement(g, h0, mesh);
            return g;
        }, _ => { });

        var cells = Enumerable.Range(0, nk).Where(k => refine[k]).ToArray();
        var sub = new Chunk[cells.Length];
        // Refinement can multiply the samples by 27 per level: count them against the machine's memory as they are
        // made, and stop with the numbers instead of being killed by the system.
        long budget = sampleLimit ?? (long)(Solver.MeshMemory.UsableFraction * Solver.MeshMemory.Available / BytesPerSample(nb));
        var count = new SampleBudget(budget - nk);
        Parallel.For(0, cells.Length, () => new BandGeometry(source, velocity), (c, state, g) =>
        {
            var chunk = new Chunk(nb);
            Split(g, km.Cartesian(cells[c]), e1, e2, e3, dim, w0, h0, 1, mesh, chunk, count);
            sub[c] = chunk;
            if (count.Exceeded) state.Stop();
            return g;
        }, _ => { });
        if (count.Exceeded)
            throw new RequestError(FormattableString.Invariant(
                $"--kmesh {mesh.Divisions} --refine {mesh.RefinementLevels}: refinement of {cells.Length:N0} of {nk:N0} cells to {mesh.RefinementLevels} level(s) needs more than {budget:N0} samples (about {Solver.MeshMemory.Gigabytes(budget * BytesPerSample(nb))}, {100 * Solver.MeshMemory.UsableFraction:F0}% of this machine's memory); use fewer refinement levels or a coarser base mesh"));

        int total = nk - cells.Length + sub.Sum(s => s.Weights.Count);
        var W = new double[total]; var E = new double[total * nb]; var V = new double[total * nb * 3]; var O = new double[total * nb * 3];
        int at = 0;
        for (int k = 0; k < nk; k++)
        {
            if (refine[k]) continue;
            W[at] = w0;
            Array.Copy(e, k * nb, E, at * nb, nb); Array.Copy(v, k * nb * 3, V, at * nb * 3, nb * 3); Array.Copy(o, k * nb * 3, O, at * nb * 3, nb * 3);
            at++;
        }
        foreach (var s in sub)
        {
            s.Weights.CopyTo(W, at);
            s.Energies.CopyTo(E, at * nb); s.Velocities.CopyTo(V, at * nb * 3); s.Curvatures.CopyTo(O, at * nb * 3);
            at += s.Weights.Count;
        }
        return new CurvatureSamples
        {
            Bands = nb, Weights = W, Energies = E, Velocities = V, Curvatures = O, BasePoints = nk,
            RefinedCells = cells.Length, Mesh = mesh, Lattice = lattice,
        };
    }

    // Weight, energies, velocities and curvatures of one sample, doubled for the growth of the lists that collect them.
    private static long BytesPerSample(int bands) => 2L * 8 * (1 + 7L * bands);

    private sealed class SampleBudget(long limit)
    {
        private long _left = limit;
        public bool Exceeded => Volatile.Read(ref _left) < 0;
        public bool Take(long n) => Interlocked.Add(ref _left, -n) >= 0;
    }

    private static bool NeedsRefinement(BandGeometry g, double h, ResponseMesh mesh)
    {
        for (int n = 0; n < g.Size; n++)
        {
            if (mesh.RefinementWindow is { } w && (g.Energies[n] < w.Min || g.Energies[n] > w.Max)) continue;
            double ox = g.Curvatures[3 * n], oy = g.Curvatures[3 * n + 1], oz = g.Curvatures[3 * n + 2];
            if (Math.Sqrt(ox * ox + oy * oy + oz * oz) * h * h > mesh.RefinementFlux) return true;
            if (mesh.ThermalWidth is { } kt)
            {
                double vx = g.Velocities[3 * n], vy = g.Velocities[3 * n + 1], vz = g.Velocities[3 * n + 2];
                if (Math.Sqrt(vx * vx + vy * vy + vz * vz) * h > kt) return true;
            }
        }
        return false;
    }

    // Replaces a cell (centre k, edges e1 e2 e3, weight w) by its 3^d sub-cells, recursing while they still need it.
    private static void Split(BandGeometry g, Vec3 k, Vec3 e1, Vec3 e2, Vec3 e3, int dim, double w, double h, int level,
                              ResponseMesh mesh, Chunk chunk, SampleBudget budget)
    {
        if (!budget.Take(dim == 3 ? 27 : 9)) return;
        Vec3 s1 = e1 / 3, s2 = e2 / 3, s3 = e3 / 3;
        double ws = w / (dim == 3 ? 27 : 9), hs = h / 3;
        int r3 = dim == 3 ? 1 : 0;
        for (int a = -1; a <= 1; a++)
            for (int b = -1; b <= 1; b++)
                for (int c = -r3; c <= r3; c++)
                {
                    var q = k + a * s1 + b * s2 + c * s3;
                    g.Compute(q);
                    if (level < mesh.RefinementLevels && NeedsRefinement(g, hs, mesh))
                        Split(g, q, s1, s2, s3, dim, ws, hs, level + 1, mesh, chunk, budget);
                    else chunk.Add(ws, g);
                }
    }

    private sealed class Chunk(int bands)
    {
        public readonly List<double> Weights = [];
        public readonly List<double> Energies = [], Velocities = [], Curvatures = [];

        public void Add(double w, BandGeometry g)
        {
            Weights.Add(w);
            for (int n = 0; n < bands; n++)
            {
                Energies.Add(g.Energies[n]);
                for (int a = 0; a < 3; a++) { Velocities.Add(g.Velocities[3 * n + a]); Curvatures.Add(g.Curvatures[3 * n + a]); }
            }
        }
    }
}
