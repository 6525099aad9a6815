using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Renormalization;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>
/// Zone average on a Monkhorst-Pack mesh, reduced to the irreducible wedge of the model's symmetry: every wedge point is
/// assembled, diagonalised and reduced to its band energies, f weights and dE/dr in parallel over threads, each with its
/// own preallocated buffers (nothing is allocated per k), and weighted by its orbit size / full mesh. The symmetry keeps
/// every shell group (see <see cref="SymmetryGroup"/>), so the group-resolved sums are exact, not only the energies.
/// Optionally the eigenvectors of the last fill are kept for the analytic Jacobian (<see cref="ISaddlePointDerivatives"/>).
/// </summary>
public sealed class MeshStateSum : IStateSum, ISaddlePointDerivatives
{
    private readonly BlochHamiltonian _bare;
    private readonly StateTable _table;
    private readonly int[] _fIndex, _fGroup;
    private readonly int[] _points;
    private readonly ThreadLocal<Workspace> _work;
    private readonly Complex[]? _vectors;
    private RenormalizedHamiltonian? _vectorsOf;

    /// <summary>The full mesh.</summary>
    public KMesh Mesh { get; }
    /// <summary>The wedge actually summed (the full mesh when the group is trivial).</summary>
    public IrreducibleMesh Irreducible { get; }
    public int Groups => _bare.GroupCount;
    public string Description => Irreducible.Count == Mesh.Count
        ? $"k-mesh {Mesh}"
        : $"k-mesh {Mesh}, {Irreducible.Count} irreducible points ({Irreducible.ActionCount} operations on k)";
    /// <summary>Seconds spent in diagonalisation during the last <see cref="Fill"/>, summed over threads.</summary>
    public double LastDiagonalisationSeconds { get; private set; }
    /// <summary>Seconds spent in diagonalisation over every pass of this sum, summed over threads.</summary>
    public double DiagonalisationSeconds { get; private set; }
    /// <summary>Whether eigenvectors are kept for <see cref="TryDerivatives"/>.</summary>
    public bool KeepsVectors => _vectors is not null;

    /// <summary>A sum over the full mesh (no symmetry), eigenvectors not kept.</summary>
    public MeshStateSum(BlochHamiltonian bare, KMesh mesh) : this(bare, mesh, SymmetryGroup.Trivial(bare), keepVectors: false) { }

    /// <summary>A sum over the wedge of <paramref name="group"/>; <paramref name="keepVectors"/> keeps n^2 amplitudes per wedge point.</summary>
    public MeshStateSum(BlochHamiltonian bare, KMesh mesh, SymmetryGroup group, bool keepVectors)
        : this(bare, new IrreducibleMesh(mesh, group), keepVectors, false, null) { }

    /// <summary>
    /// A sum over <paramref name="wedge"/> that takes over the buffers (state table, eigenvectors, per-thread
    /// workspaces) of <paramref name="recycle"/>, an earlier sum over the same wedge for a model of the same structure
    /// that is no longer used: every buffer is overwritten before it is read, so results do not depend on it.
    /// <paramref name="keepParts"/> keeps the bare parts U(k) and S(k) of every wedge point (2 n^2 amplitudes each), made
    /// once on the first pass instead of at every pass and every Jacobian (the same numbers, so the same results).
    /// </summary>
    internal MeshStateSum(BlochHamiltonian bare, IrreducibleMesh wedge, bool keepVectors, bool keepParts, MeshStateSum? recycle)
    {
        _bare = bare; Mesh = wedge.Mesh;
        Irreducible = wedge;
        int n = bare.Size, count = Irreducible.Count;
        (_fIndex, _fGroup) = StateProjection.CorrelatedIndices(bare.GroupOfBasis);
        bool ffBonds = HasShellBonds(bare.Model);
        if (recycle is not null && (!ReferenceEquals(recycle.Irreducible, wedge) || recycle._bare.Size != n
            || recycle._table.Groups != bare.GroupCount || !recycle._fIndex.AsSpan().SequenceEqual(_fIndex)
            || !recycle._fGroup.AsSpan().SequenceEqual(_fGroup) || recycle._ffBonds != ffBonds)) recycle = null;
        _ffBonds = ffBonds;
        if (recycle is not null)
        {
            // Same wedge: the points and their orbit weights are the table's already.
            _points = recycle._points; _table = recycle._table; _work = recycle._work; _chunkDerivatives = recycle._chunkDerivatives;
            if (keepVectors) _vectors = recycle._vectors;
            if (keepParts) _parts = recycle._parts; // refilled for this model on the first pass
        }
        else
        {
            _points = Irreducible.Representatives.ToArray();
            _table = new StateTable(count * n, bare.GroupCount, uniformWeights: true);
            var mult = Irreducible.Multiplicity;
            for (int w = 0; w < count; w++)
            {
                double weight = mult[w] / (double)Mesh.Count;
                for (int m = 0; m < n; m++) _table.Weight[w * n + m] = weight;
            }
            _work = new ThreadLocal<Workspace>(() => new Workspace(n));
        }
        if (keepVectors && _vectors is null && (long)count * n * n < Array.MaxLength) _vectors = new Complex[count * n * n];
        if (keepParts && _parts is null && 2L * count * n * n < Array.MaxLength) _parts = new Complex[2 * count * n * n];
    }

    /// <summary>U(k) then S(k) of every wedge point (2 n^2 per point), or null; valid once <see cref="_partsMade"/>.</summary>
    private readonly Complex[]? _parts;
    private bool _partsMade;

    /// <summary>Makes the bare parts of every wedge point once (they do not depend on the amplitudes).</summary>
    private void MakeParts()
    {
        if (_parts is null || _partsMade) return;
        int nn = _bare.Size * _bare.Size;
        Run((w, lo, hi) =>
        {
            for (int p = lo; p < hi; p++)
                _bare.AssembleParts(Mesh.Cartesian(_points[p]), _parts.AsSpan(2 * p * nn, nn), _parts.AsSpan((2 * p + 1) * nn, nn));
        });
        _partsMade = true;
    }

    /// <summary>H_MF at wedge point <paramref name="p"/> into the workspace's H; returns the bare S(k) there.</summary>
    private ReadOnlySpan<Complex> Assemble(RenormalizedHamiltonian ham, int p, Workspace w)
    {
        if (_parts is null)
        {
            ham.Assemble(Mesh.Cartesian(_points[p]), w.H, w.S);
            return w.S;
        }
        int nn = _bare.Size * _bare.Size;
        _parts.AsSpan(2 * p * nn, nn).CopyTo(w.H);
        var scaled = _parts.AsSpan((2 * p + 1) * nn, nn);
        ham.Combine(w.H, scaled);
        return scaled;
    }

    private readonly bool _ffBonds;
    private StateDerivatives[]? _chunkDerivatives;

    private StateDerivatives[] NewChunkDerivatives()
    {
        var sums = new StateDerivatives[Chunks];
        for (int c = 0; c < sums.Length; c++) sums[c] = new StateDerivatives(_bare.Size, _bare.GroupCount, _fIndex, _fGroup, _ffBonds);
        return sums;
    }

    private static bool HasShellBonds(BoundModel model) =>
        model.Hoppings.Any(h => model.Orbitals[h.From].Kind == OrbitalKind.Correlated && model.Orbitals[h.To].Kind == OrbitalKind.Correlated);

    /// <summary>
    /// Bytes a sum over <paramref name="wedgePoints"/> points of an n-band model with <paramref name="groups"/> shell groups
    /// holds: the state table ((2 + 2G) doubles per state), the wedge lists, the eigenvectors when kept, and the
    /// transient bit per full-mesh point used to build the wedge.
    /// </summary>
    public static long EstimateBytes(long wedgePoints, long fullPoints, int n, int groups, bool keepVectors) =>
        wedgePoints * n * (2 + 2L * groups) * sizeof(double) + wedgePoints * 2 * sizeof(int)
        + (keepVectors ? wedgePoints * n * n * 16L : 0) + fullPoints / 8;

    private sealed class Workspace(int n)
    {
        public readonly IHermitianEigensolver Solver = Eigensolvers.Create(n);
        public readonly Complex[] H = new Complex[n * n], S = new Complex[n * n], V = new Complex[n * n];
        public readonly double[] E = new double[n];
        public long DiagonalisationTicks;
    }

    public StateTable Fill(MeanFieldAmplitudes amplitudes)
    {
        var ham = new RenormalizedHamiltonian(_bare, amplitudes);
        _vectorsOf = _vectors is null ? null : ham;
        _filledAt = amplitudes;
        MakeParts();
        Run((w, lo, hi) => { for (int p = lo; p < hi; p++) FillPoint(ham, p, w); });
        return _table;
    }

    /// <summary>
    /// Energies only (values-only diagonalisation, f weights and slopes left zero): enough for mu and Omega_band, as the
    /// decoupled branch needs. Invalidates the kept eigenvectors.
    /// </summary>
    public StateTable FillEnergies(MeanFieldAmplitudes amplitudes)
    {
        var ham = new RenormalizedHamiltonian(_bare, amplitudes);
        _vectorsOf = null;
        _filledAt = null;
        int n = _bare.Size;
        Array.Clear(_table.FWeight); Array.Clear(_table.EnergySlope);
        MakeParts();
        Run((w, lo, hi) =>
        {
            for (int p = lo; p < hi; p++)
            {
                Assemble(ham, p, w);
                long t0 = System.Diagnostics.Stopwatch.GetTimestamp();
                w.Solver.Solve(w.H, w.E, Span<Complex>.Empty);
                w.DiagonalisationTicks += System.Diagnostics.Stopwatch.GetTimestamp() - t0;
                w.E.AsSpan().CopyTo(_table.Energy.AsSpan(p * n, n));
            }
        });
        return _table;
    }

    private MeanFieldAmplitudes? _filledAt;

    /// <summary>
    /// A copy of the last <see cref="Fill"/>'s energies and correlated weights when it was made at exactly
    /// <paramref name="amplitudes"/> (null otherwise, or after <see cref="FillEnergies"/>): the final pass of a solve,
    /// for the spectrum digest.
    /// </summary>
    public ZonePass? LastPass(MeanFieldAmplitudes amplitudes)
    {
        if (_filledAt is null) return null;
        var pass = new ZonePass(Irreducible, _bare.Size, (double[])_table.Energy.Clone(), new double[_table.Count], _filledAt);
        if (!pass.MadeAt(amplitudes)) return null;
        int groups = _table.Groups;
        for (int state = 0; state < _table.Count; state++)
            for (int g = 0; g < groups; g++) pass.Correlated[state] += _table.FWeight[state * groups + g];
        return pass;
    }

    /// <summary>Contiguous chunks of the wedge a pass is split into (one per core).</summary>
    private int Chunks => Math.Max(1, Math.Min(Environment.ProcessorCount, _points.Length));

    private void Run(Action<Workspace, int, int> body) => Run((w, _, lo, hi) => body(w, lo, hi));

    /// <summary>Runs <paramref name="body"/>(workspace, chunk, first, end) over the chunks in parallel.</summary>
    private void Run(Action<Workspace, int, int, int> body)
    {
        int count = _points.Length, chunks = Chunks;
        long ticks = 0;
        Parallel.For(0, chunks, c =>
        {
            var w = _work.Value!;
            w.DiagonalisationTicks = 0;
            body(w, c, (int)((long)count * c / chunks), (int)((long)count * (c + 1) / chunks));
            Interlocked.Add(ref ticks, w.DiagonalisationTicks);
        });
        LastDiagonalisationSeconds = ticks / (double)System.Diagnostics.Stopwatch.Frequency;
        DiagonalisationSeconds += LastDiagonalisationSeconds;
    }

    private void FillPoint(RenormalizedHamiltonian ham, int p, Workspace w)
    {
        int n = _bare.Size;
        var scaled = Assemble(ham, p, w);
        long t0 = System.Diagnostics.Stopwatch.GetTimestamp();
        w.Solver.Solve(w.H, w.E, w.V);
        w.DiagonalisationTicks += System.Diagnostics.Stopwatch.GetTimestamp() - t0;
        StateProjection.Store(_table, p * n, n, w.E, w.V, scaled, ham.Scale, _fIndex, _fGroup);
        if (_vectors is not null) w.V.AsSpan().CopyTo(_vectors.AsSpan(p * n * n, n * n));
    }

    public bool TryDerivatives(double mu, double temperature, double[] result)
    {
        if (_vectors is null || _vectorsOf is not { } ham) return false;
        int n = _bare.Size;
        // One accumulator per chunk, merged in chunk order: the sums do not depend on which thread ran which chunk.
        var sums = _chunkDerivatives ??= NewChunkDerivatives();
        foreach (var d in sums) d.Clear();
        Run((w, c, lo, hi) =>
        {
            var d = sums[c];
            int nn = n * n;
            for (int p = lo; p < hi; p++)
            {
                ReadOnlySpan<Complex> scaled;
                if (_partsMade) scaled = _parts.AsSpan((2 * p + 1) * nn, nn);
                else { _bare.AssembleParts(Mesh.Cartesian(_points[p]), w.H, w.S); scaled = w.S; }
                d.Add(_table.Weight[p * n], _table.Energy.AsSpan(p * n, n), _vectors.AsSpan(p * n * n, n * n),
                      scaled, ham.Scale, mu, temperature);
            }
        });
        for (int c = 1; c < sums.Length; c++) sums[0].Merge(sums[c]);
        sums[0].Result(result);
        return true;
    }
}
