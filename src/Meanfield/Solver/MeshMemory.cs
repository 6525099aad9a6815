using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>
/// The memory a mesh solve needs, estimated before any work from the irreducible wedge, and the refusal of a mesh the
/// machine cannot hold.
/// </summary>
public static class MeshMemory
{
    /// <summary>Share of the machine's memory a solve may plan to use (the rest is the runtime, the analyses, other work).</summary>
    public const double UsableFraction = 0.75;
    /// <summary>Share of the machine's memory below which eigenvectors are kept for the analytic Jacobian.</summary>
    public const double VectorFraction = 0.25;
    /// <summary>Bytes of the fine and the half-mesh start together, relative to the fine mesh alone (1 + 1/8 in 3D).</summary>
    private const double CoarseOverhead = 1.125;

    /// <summary>Memory the runtime reports as available to this process (physical memory or the container's limit), bytes.</summary>
    public static long Available => GC.GetGCMemoryInfo().TotalAvailableMemoryBytes;

    /// <summary>
    /// The estimate for a solve of <paramref name="model"/> on <paramref name="settings"/>' mesh under
    /// <paramref name="group"/>: wedge points, full points, and bytes with and without kept eigenvectors.
    /// </summary>
    public static (long Wedge, long Full, long Bytes, long BytesWithVectors) Estimate(BoundModel model, SolverSettings settings, SymmetryGroup group)
    {
        int n = settings.Mesh, dim = model.Lattice.Dimension;
        long full = dim >= 3 ? (long)n * n * n : (long)n * n;
        int groups = model.ShellGroups().Count;
        long wedge;
        if (full > int.MaxValue) wedge = full / Math.Max(1, group.KActions.Count);
        else wedge = IrreducibleMesh.EstimateCount(new KMesh(model.Lattice, n, settings.Shifted), group);
        long plain = (long)(CoarseOverhead * MeshStateSum.EstimateBytes(wedge, full, model.BasisSize, groups, keepVectors: false));
        long vectors = (long)(CoarseOverhead * MeshStateSum.EstimateBytes(wedge, full, model.BasisSize, groups, keepVectors: true));
        return (wedge, full, plain, vectors);
    }

    /// <summary>
    /// Refuses a mesh whose estimate exceeds <see cref="UsableFraction"/> of <see cref="Available"/>, or whose point count
    /// exceeds the index range; returns whether the eigenvectors fit too (for the analytic Jacobian), and the mesh.
    /// </summary>
    /// <exception cref="RequestError">The mesh is too large for this machine (the message gives the estimate).</exception>
    public static bool Check(BoundModel model, SolverSettings settings, SymmetryGroup group, out KMesh mesh)
    {
        var (wedge, full, bytes, withVectors) = Estimate(model, settings, group);
        long available = Available;
        if (full > int.MaxValue || bytes > UsableFraction * available)
            throw new RequestError(
                $"mesh {settings.Mesh}: {full:N0} k-points ({wedge:N0} irreducible) need about {Gigabytes(bytes)} for the saddle point, " +
                $"more than {100 * UsableFraction:F0}% of the {Gigabytes(available)} this machine offers" +
                (full > int.MaxValue ? " (and more points than one mesh can index)" : "") + "; use a smaller --mesh");
        mesh = new KMesh(model.Lattice, settings.Mesh, settings.Shifted);
        return withVectors <= VectorFraction * available;
    }

    /// <summary>
    /// Whether the bare parts U(k) and S(k) of every wedge point (2 n^2 amplitudes each, made once per solve instead of at
    /// every pass) fit beside the kept eigenvectors within <see cref="VectorFraction"/>; never changes whether the
    /// eigenvectors are kept.
    /// </summary>
    public static bool PartsFit(BoundModel model, SolverSettings settings, SymmetryGroup group)
    {
        var (wedge, _, _, withVectors) = Estimate(model, settings, group);
        long amplitudes = 2 * wedge * model.BasisSize * model.BasisSize;
        return amplitudes < Array.MaxLength && withVectors + (long)(CoarseOverhead * amplitudes * 16) <= VectorFraction * Available;
    }

    /// <summary>Bytes as "4.8 GB" / "12 MB".</summary>
    public static string Gigabytes(long bytes) => bytes >= 1L << 30
        ? FormattableString.Invariant($"{bytes / (double)(1L << 30):F1} GB")
        : FormattableString.Invariant($"{bytes / (double)(1L << 20):F0} MB");
}
