using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>
/// Zone average on a Monkhorst-Pack mesh: every k-point is assembled, diagonalised and reduced to its band energies, f
/// weights and dE/dr in parallel over threads, each with its own preallocated buffers (nothing is allocated per k).
/// </summary>
public sealed class MeshStateSum : IStateSum
{
    private readonly BlochHamiltonian _bare;
    private readonly StateTable _table;
    private readonly int[] _fIndex, _fGroup;
    private readonly ThreadLocal<Workspace> _work;

    public KMesh Mesh { get; }
    public int Groups => _bare.GroupCount;
    public string Description => $"k-mesh {Mesh}";
    /// <summary>Seconds spent in diagonalisation during the last <see cref="Fill"/>, summed over threads.</summary>
    public double LastDiagonalisationSeconds { get; private set; }

    public MeshStateSum(BlochHamiltonian bare, KMesh mesh)
    {
        _bare = bare; Mesh = mesh;
        int n = bare.Size;
        _table = new StateTable(mesh.Count * n, bare.GroupCount, uniformWeights: true);
        Array.Fill(_table.Weight, 1.0 / mesh.Count);
        (_fIndex, _fGroup) = StateProjection.CorrelatedIndices(bare.GroupOfBasis);
        _work = new ThreadLocal<Workspace>(() => new Workspace(n), trackAllValues: false);
    }

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
        int n = _bare.Size, chunks = Math.Max(1, Environment.ProcessorCount);
        long ticks = 0;
        Parallel.For(0, chunks, c =>
        {
            var w = _work.Value!;
            w.DiagonalisationTicks = 0;
            int start = (int)((long)Mesh.Count * c / chunks), end = (int)((long)Mesh.Count * (c + 1) / chunks);
            for (int kp = start; kp < end; kp++) FillPoint(ham, kp, w, n);
            Interlocked.Add(ref ticks, w.DiagonalisationTicks);
        });
        LastDiagonalisationSeconds = ticks / (double)System.Diagnostics.Stopwatch.Frequency;
        return _table;
    }

    private void FillPoint(RenormalizedHamiltonian ham, int kp, Workspace w, int n)
    {
        ham.Assemble(Mesh.Cartesian(kp), w.H, w.S);
        long t0 = System.Diagnostics.Stopwatch.GetTimestamp();
        w.Solver.Solve(w.H, w.E, w.V);
        w.DiagonalisationTicks += System.Diagnostics.Stopwatch.GetTimestamp() - t0;
        StateProjection.Store(_table, kp * n, n, w.E, w.V, w.S, ham.Scale, _fIndex, _fGroup);
    }
}
