using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Units;

namespace Meanfield.Analysis.Bands;

/// <summary>
/// Eigenvalues of H(k) along a sampled band path, with the character of every state: the correlated-orbital weight
/// w_f(k, n) = sum over correlated basis indices i of |psi_{i,n}(k)|^2 (0 for a pure conduction state, 1 for a pure f
/// state) and the weight on each site of the cell. Energies are in <see cref="Unit"/>, bands ascending at each k.
/// </summary>
public sealed class BandStructure
{
    private readonly double[,] _energy;
    private readonly double[,] _fWeight;
    private readonly double[,,] _siteWeight;

    private BandStructure(BandPathSample path, EnergyUnit unit, IReadOnlyList<string> siteNames,
                          double[,] energy, double[,] fWeight, double[,,] siteWeight)
    {
        Path = path; Unit = unit; SiteNames = siteNames;
        _energy = energy; _fWeight = fWeight; _siteWeight = siteWeight;
    }

    public BandPathSample Path { get; }
    public EnergyUnit Unit { get; }
    public IReadOnlyList<string> SiteNames { get; }
    public int KCount => _energy.GetLength(0);
    public int BandCount => _energy.GetLength(1);

    /// <summary>Energy E_n(k) of band <paramref name="band"/> at k-point <paramref name="k"/>, in <see cref="Unit"/>.</summary>
    public double Energy(int k, int band) => _energy[k, band];
    /// <summary>Weight of the state on the correlated orbitals, between 0 and 1.</summary>
    public double CorrelatedWeight(int k, int band) => _fWeight[k, band];
    /// <summary>Weight of the state on the orbitals of site <paramref name="site"/>, between 0 and 1.</summary>
    public double SiteWeight(int k, int band, int site) => _siteWeight[k, band, site];

    /// <summary>A copy of the energies as [k, band].</summary>
    public double[,] Energies() => (double[,])_energy.Clone();

    /// <summary>Lowest and highest energy over the path.</summary>
    public (double Min, double Max) EnergyRange()
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var e in _energy) { lo = Math.Min(lo, e); hi = Math.Max(hi, e); }
        return (lo, hi);
    }

    /// <summary>
    /// Diagonalizes H(k) at every k-point of <paramref name="path"/>, in parallel over k with one eigensolver and one set
    /// of buffers per worker. <paramref name="source"/> must allow concurrent <see cref="IBlochSource.Assemble"/> calls.
    /// </summary>
    public static BandStructure Compute(IBlochSource source, BandPathSample path, int maxDegreeOfParallelism = -1)
    {
        var model = source.Model;
        int n = source.Size, nk = path.Count, f = model.Flavours, sites = model.Sites.Count;
        if (n != model.BasisSize) throw new ArgumentException($"H(k) has size {n} but the model basis has {model.BasisSize} states.");
        var correlated = new bool[n];
        var siteOf = new int[n];
        for (int o = 0; o < model.Orbitals.Count; o++)
            for (int a = 0; a < f; a++)
            {
                correlated[o * f + a] = model.Orbitals[o].Kind == OrbitalKind.Correlated;
                siteOf[o * f + a] = model.Orbitals[o].Site;
            }

        var energy = new double[nk, n];
        var fWeight = new double[nk, n];
        var siteWeight = new double[nk, n, sites];
        var options = new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism };
        Parallel.For(0, nk, options,
            () => new Workspace(n),
            (ik, _, w) =>
            {
                source.Assemble(path.K[ik], w.H, w.Scratch);
                w.Solver.Solve(w.H, w.Values, w.Vectors);
                for (int m = 0; m < n; m++)
                {
                    energy[ik, m] = w.Values[m];
                    double fw = 0;
                    for (int i = 0; i < n; i++)
                    {
                        double p = w.Vectors[i * n + m].Real * w.Vectors[i * n + m].Real
                                 + w.Vectors[i * n + m].Imaginary * w.Vectors[i * n + m].Imaginary;
                        if (correlated[i]) fw += p;
                        siteWeight[ik, m, siteOf[i]] += p;
                    }
                    fWeight[ik, m] = fw;
                }
                return w;
            },
            _ => { });
        var names = model.Sites.Select(s => s.Name).ToArray();
        return new BandStructure(path, model.Unit, names, energy, fWeight, siteWeight);
    }

    /// <summary>Per-worker buffers, so the k-loop allocates nothing of its own.</summary>
    private sealed class Workspace(int n)
    {
        public readonly Complex[] H = new Complex[n * n];
        public readonly Complex[] Scratch = new Complex[n * n];
        public readonly double[] Values = new double[n];
        public readonly Complex[] Vectors = new Complex[n * n];
        public readonly IHermitianEigensolver Solver = Eigensolvers.Create(n);
    }
}
