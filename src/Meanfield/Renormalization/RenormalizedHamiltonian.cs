using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Renormalization;

/// <summary>
/// The mean-field Bloch Hamiltonian of the infinite-U auxiliary-boson theory (Read &amp; Newns, J. Phys. C 16, 3273 (1983);
/// Coleman, PRB 29, 3035 (1984)):
///   H_MF(k) = U(k) + diag(eps_f + lambda_g on f) + G S(k) G,   G = diag(1 on c, r_g on f),
/// where U holds the conduction bonds and all on-site terms (number conserving on the f shell, so not renormalized) and
/// S the bonds with a correlated end (hybridization, f-f hopping), which carry one boson per f operator.
/// </summary>
public sealed class RenormalizedHamiltonian : IBlochSource
{
    private readonly double[] _scale;     // g_i per basis index
    private readonly double[] _diagonal;  // eps_f + lambda on f indices, 0 on c

    public BlochHamiltonian Bare { get; }
    public MeanFieldAmplitudes Amplitudes { get; }
    public BoundModel Model => Bare.Model;
    public int Size => Bare.Size;
    public ReadOnlySpan<double> Scale => _scale;

    public RenormalizedHamiltonian(BlochHamiltonian bare, MeanFieldAmplitudes amplitudes)
    {
        if (amplitudes.GroupCount != bare.GroupCount) throw new ArgumentException("one (r, lambda) pair per shell group is needed");
        Bare = bare; Amplitudes = amplitudes;
        _scale = new double[bare.Size]; _diagonal = new double[bare.Size];
        for (int i = 0; i < bare.Size; i++)
        {
            int g = bare.GroupOfBasis[i];
            _scale[i] = g < 0 ? 1.0 : amplitudes.R[g];
            _diagonal[i] = g < 0 ? 0.0 : bare.Levels[i] + amplitudes.Lambda[g];
        }
    }

    /// <summary>H_MF(k) into <paramref name="h"/>; on return <paramref name="scaled"/> holds the bare S(k) for derivatives.</summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // hot loop: skip tier-0 code
    public void Assemble(Vec3 k, Span<Complex> h, Span<Complex> scaled)
    {
        Bare.AssembleParts(k, h, scaled);
        Combine(h, scaled);
    }

    /// <summary>
    /// H_MF from the bare parts: <paramref name="h"/> holds the fixed part U(k) on entry and H_MF(k) on return;
    /// <paramref name="scaled"/> is the bare S(k) (<see cref="BlochHamiltonian.AssembleParts"/>), for callers that keep the parts of a mesh.
    /// </summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)] // hot loop: skip tier-0 code
    public void Combine(Span<Complex> h, ReadOnlySpan<Complex> scaled)
    {
        int n = Size;
        for (int i = 0; i < n; i++)
        {
            double gi = _scale[i];
            int row = i * n;
            for (int j = 0; j < n; j++)
            {
                // h += (g_i g_j) S_ij, written out (the JIT does not inline Complex's operators here; same bits).
                double gg = gi * _scale[j]; var sij = scaled[row + j]; var hij = h[row + j];
                h[row + j] = new Complex(hij.Real + gg * sij.Real, hij.Imaginary + gg * sij.Imaginary);
            }
            h[row + i] += _diagonal[i];
        }
    }
}
