using Meanfield.Lattices;

namespace Meanfield.Symmetry;

/// <summary>
/// The irreducible wedge of a Monkhorst-Pack mesh under a symmetry group: one representative per orbit (the orbit's
/// smallest full-mesh index, so representatives ascend) with its integer multiplicity (orbit size; the multiplicities sum
/// to the full mesh). Only the group's actions that map the mesh onto itself are used (a shifted mesh keeps fewer).
/// A full-mesh point is located on the fly (<see cref="Locate"/>): no array over the full mesh is kept.
/// Zone sums: Avg_k X(k) = sum_w Multiplicity[w] X(k_w) / Mesh.Count for every X the group keeps.
/// </summary>
public sealed class IrreducibleMesh
{
    private readonly int[] _representatives, _multiplicity;
    private readonly MeshAction[] _actions;

    /// <summary>The full mesh.</summary>
    public KMesh Mesh { get; }
    /// <summary>The group the wedge was built from.</summary>
    public SymmetryGroup Group { get; }
    /// <summary>Points of the wedge.</summary>
    public int Count => _representatives.Length;
    /// <summary>Full-mesh index of each wedge point, ascending.</summary>
    public ReadOnlySpan<int> Representatives => _representatives;
    /// <summary>Orbit size of each wedge point (points of the full mesh it stands for).</summary>
    public ReadOnlySpan<int> Multiplicity => _multiplicity;
    /// <summary>Distinct actions on the mesh index that were used (identity first).</summary>
    public int ActionCount => _actions.Length;
    /// <summary>Full mesh points per wedge point.</summary>
    public double ReductionFactor => Mesh.Count / (double)Count;

    /// <summary>
    /// The action of one operation on mesh indices: i' = T i + c (mod N), and an operation of the group acting so
    /// (<see cref="Operation"/>, for mapping eigenvectors: psi(k') = U psi(k)^(*)).
    /// </summary>
    private sealed record MeshAction(int[] T, int[] C, SymmetryOperation Operation);

    public IrreducibleMesh(KMesh mesh, SymmetryGroup group)
    {
        Mesh = mesh; Group = group;
        _actions = Actions(mesh, group);
        var visited = new ulong[(mesh.Count + 63) / 64];
        var reps = new List<int>(); var mult = new List<int>();
        for (int i = 0; i < mesh.Count; i++)
        {
            if ((visited[i >> 6] & (1UL << (i & 63))) != 0) continue;
            int size = 0;
            foreach (var a in _actions)
            {
                int j = Apply(a, i);
                if ((visited[j >> 6] & (1UL << (j & 63))) != 0) continue;
                visited[j >> 6] |= 1UL << (j & 63);
                size++;
            }
            reps.Add(i); mult.Add(size);
        }
        _representatives = [.. reps]; _multiplicity = [.. mult];
    }

    /// <summary>
    /// Wedge points expected before building it: full / actions plus the extra points of smaller orbits. Those lie on
    /// mirror planes (at most actions/2 planes of N^2 points, each orbit of actions/2 points, so at most N^2 extra) and
    /// axes; 2 N^2 bounds both. Capped at the full mesh. Uses no memory over the mesh.
    /// </summary>
    public static long EstimateCount(KMesh mesh, SymmetryGroup group)
    {
        long full = (long)mesh.N1 * mesh.N2 * mesh.N3;
        int actions = Actions(mesh, group).Length;
        long plane = (long)Math.Max(mesh.N1, mesh.N2) * Math.Max(mesh.N2, mesh.N3);
        return Math.Min(full, full / actions + (actions > 1 ? 2 * plane : 0));
    }

    /// <summary>
    /// The wedge point of full-mesh point <paramref name="fullIndex"/> and the operation that maps it there
    /// (k_wedge = S k_full, S its <see cref="SymmetryOperation.ReciprocalMatrix"/> up to a reciprocal-lattice vector).
    /// </summary>
    /// <exception cref="ArgumentOutOfRangeException">The index is outside the mesh.</exception>
    public (int Wedge, SymmetryOperation Operation) Locate(int fullIndex)
    {
        if ((uint)fullIndex >= (uint)Mesh.Count) throw new ArgumentOutOfRangeException(nameof(fullIndex));
        int best = int.MaxValue; SymmetryOperation? op = null;
        foreach (var a in _actions)
        {
            int j = Apply(a, fullIndex);
            if (j < best) { best = j; op = a.Operation; }
        }
        return (Array.BinarySearch(_representatives, best), op!);
    }

    /// <summary>
    /// The wedge point of every full-mesh point, as one array (4 bytes per full point): for loops over the whole mesh
    /// that look points up many times, where <see cref="Locate"/> per point would cost a search each time.
    /// </summary>
    public int[] WedgeOfEveryPoint()
    {
        var row = new int[Mesh.Count];
        for (int w = 0; w < _representatives.Length; w++)
            foreach (var a in _actions) row[Apply(a, _representatives[w])] = w;
        return row;
    }

    /// <summary>Image of a full-mesh index under action <paramref name="a"/>.</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // hot loop: skip tier-0 code
    private int Apply(MeshAction a, int index)
    {
        int n1 = Mesh.N1, n2 = Mesh.N2, n3 = Mesh.N3;
        int i3 = index % n3, rest = index / n3, i2 = rest % n2, i1 = rest / n2;
        var t = a.T; var c = a.C;
        int j1 = t[0] * i1 + t[1] * i2 + t[2] * i3 + c[0];
        int j2 = t[3] * i1 + t[4] * i2 + t[5] * i3 + c[1];
        int j3 = t[6] * i1 + t[7] * i2 + t[8] * i3 + c[2];
        return Mesh.Index(j1, j2, j3);
    }

    /// <summary>
    /// The group's actions on mesh indices: u = (i + s)/N maps to K u, so i'_a = sum_b K_ab (N_a/N_b) i_b + c_a with
    /// c_a = sum_b K_ab N_a s_b / N_b - s_a; the action maps the mesh onto itself only when both are integers.
    /// A 2D mesh (one point along b3, u3 = 0) ignores the third axis. Duplicate actions are dropped.
    /// </summary>
    private static MeshAction[] Actions(KMesh mesh, SymmetryGroup group)
    {
        bool planar = mesh.N3 == 1 && mesh.Lattice.Dimension < 3;
        int[] n = [mesh.N1, mesh.N2, mesh.N3];
        // Twice the shift, so everything stays integer: 2 s_a = 1 on shifted axes.
        int[] s2 = [mesh.Shifted ? 1 : 0, mesh.Shifted ? 1 : 0, mesh.Shifted && !planar ? 1 : 0];
        var list = new List<MeshAction>();
        var seen = new HashSet<string>();
        foreach (var op in group.Operations)
        {
            var k = op.ReciprocalMatrix;
            var t = new int[9]; var c = new int[3];
            bool ok = true;
            for (int a = 0; a < 3 && ok; a++)
            {
                int c2 = -s2[a];
                for (int b = 0; b < 3; b++)
                {
                    int kab = planar && (a == 2 || b == 2) ? (a == b ? 1 : 0) : k[a, b];
                    if (kab == 0) continue;
                    if ((long)kab * n[a] % n[b] != 0) { ok = false; break; }
                    t[a * 3 + b] = (int)((long)kab * n[a] / n[b]);
                    c2 += t[a * 3 + b] * s2[b];
                }
                if (!ok || c2 % 2 != 0) { ok = false; break; }
                c[a] = c2 / 2;
            }
            if (!ok) continue;
            if (planar && (k[0, 2] != 0 || k[1, 2] != 0 || k[2, 0] != 0 || k[2, 1] != 0)) continue;
            if (seen.Add(string.Join(',', t) + ";" + string.Join(',', c))) list.Add(new MeshAction(t, c, op));
        }
        return [.. list];
    }
}
