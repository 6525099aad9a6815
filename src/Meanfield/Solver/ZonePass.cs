using Meanfield.Renormalization;
using Meanfield.Symmetry;

namespace Meanfield.Solver;

/// <summary>
/// The band energies and correlated weights of one pass over a k-mesh's irreducible wedge at fixed amplitudes: kept
/// from the final pass of a solve, so the spectrum digest (gaps, DOS at mu, node seeds) reads the solver's own
/// eigenvalues instead of diagonalising the zone again. Memory: 2 doubles per wedge point and band.
/// </summary>
public sealed class ZonePass
{
    /// <summary>The wedge the rows belong to (row w is the wedge point <c>Wedge.Representatives[w]</c>).</summary>
    public IrreducibleMesh Wedge { get; }
    /// <summary>Bands per k-point (size of H(k)).</summary>
    public int Bands { get; }
    /// <summary>E[w * Bands + n], ascending in n (energy unit).</summary>
    public double[] Energies { get; }
    /// <summary>Weight of state (w, n) on the correlated orbitals, sum_i |psi_i|^2 over them, index w * Bands + n.</summary>
    public double[] Correlated { get; }
    /// <summary>The amplitudes the pass was made at (null for a bare or loaded Hamiltonian).</summary>
    public MeanFieldAmplitudes? Amplitudes { get; }

    /// <summary>A pass over <paramref name="wedge"/>; the arrays are taken as they are, not copied.</summary>
    /// <exception cref="ArgumentException">Array lengths that do not match the wedge and band count.</exception>
    public ZonePass(IrreducibleMesh wedge, int bands, double[] energies, double[] correlated, MeanFieldAmplitudes? amplitudes)
    {
        if (bands < 1 || energies.Length != (long)wedge.Count * bands || correlated.Length != energies.Length)
            throw new ArgumentException($"a pass over {wedge.Count} wedge points and {bands} bands needs {wedge.Count * bands} energies and weights");
        Wedge = wedge; Bands = bands; Energies = energies; Correlated = correlated; Amplitudes = amplitudes;
    }

    /// <summary>Row (wedge point) of every full-mesh point, built once on first use.</summary>
    public int[] RowOfPoint => _rows ??= Wedge.WedgeOfEveryPoint();
    private int[]? _rows;

    /// <summary>True when the pass was made at exactly these amplitudes (bit for bit).</summary>
    public bool MadeAt(MeanFieldAmplitudes amplitudes) =>
        Amplitudes is { } a && a.R.SequenceEqual(amplitudes.R) && a.Lambda.SequenceEqual(amplitudes.Lambda);
}
