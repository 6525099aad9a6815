using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;
using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>
/// Average over a momentum-free conduction band: H(eps) = eps on the conduction orbital plus the local terms (on-site
/// energies, shell level, on-site hybridization), integrated against a model DOS rho(eps) of half-width D.
/// Flat: rho = 1/(2D), composite Gauss-Legendre. Semi-elliptic: rho = (2/(pi D^2)) sqrt(D^2 - eps^2), Gauss-Chebyshev of
/// the second kind (Abramowitz &amp; Stegun, Handbook of Mathematical Functions (1964), 25.4.40), exact for the sqrt weight.
/// At T &gt; 0 the integrands are smooth and the quadrature converges fast; at T = 0 in a metal the Fermi step sits
/// between nodes and the error falls only as the square of the node spacing.
/// </summary>
public sealed class LocalDosStateSum : IStateSum, ISaddlePointDerivatives
{
    private readonly BlochHamiltonian _bare;
    private readonly StateTable _table;
    private readonly double[] _eps;
    private readonly bool[] _conduction;
    private readonly int _n;
    private readonly int[] _fIndex, _fGroup;
    private readonly Complex[] _vectors, _scaled;
    private readonly bool _ffBonds;
    private RenormalizedHamiltonian? _vectorsOf;

    public int Groups => _bare.GroupCount;
    public string Description { get; }

    /// <summary>The state sum of a one-cell model over its model DOS with <paramref name="nodes"/> quadrature nodes.</summary>
    /// <exception cref="RequestError">A bond of the model that leaves the cell.</exception>
    /// <exception cref="ArgumentException">A DOS half-width that is not positive.</exception>
    public LocalDosStateSum(BlochHamiltonian bare, int nodes = 32768)
    {
        _bare = bare; _n = bare.Size;
        var model = bare.Model;
        foreach (var h in model.Hoppings)
            if (h.R != (0, 0, 0))
                throw new RequestError($"momentum-free lattice: bond '{h.Source}' connects different cells; only local terms are allowed");
        double d = model.DosHalfWidth;
        if (!(d > 0)) throw new ArgumentException("momentum-free lattice needs a positive DOS half-width D");
        var (eps, weight) = model.Lattice.Kind == LatticeKind.FlatDos ? FlatNodes(d, nodes) : SemiEllipticNodes(d, nodes);
        _eps = eps;
        (_fIndex, _fGroup) = StateProjection.CorrelatedIndices(bare.GroupOfBasis);
        _conduction = new bool[_n];
        for (int i = 0; i < _n; i++) _conduction[i] = bare.GroupOfBasis[i] < 0;
        _table = new StateTable(eps.Length * _n, bare.GroupCount, uniformWeights: false);
        _vectors = new Complex[eps.Length * _n * _n];
        _scaled = new Complex[_n * _n];
        _ffBonds = model.Hoppings.Any(h => model.Orbitals[h.From].Kind == Binding.OrbitalKind.Correlated && model.Orbitals[h.To].Kind == Binding.OrbitalKind.Correlated);
        for (int p = 0; p < eps.Length; p++)
            for (int m = 0; m < _n; m++) _table.Weight[p * _n + m] = weight[p];
        Description = $"{(model.Lattice.Kind == LatticeKind.FlatDos ? "flat" : "semi-elliptic")} DOS, D = {d:G6}, {eps.Length} quadrature nodes";
    }

    private static (double[], double[]) FlatNodes(double d, int nodes)
    {
        // 8-point Gauss-Lobatto panels (Abramowitz & Stegun 25.4.32): the panel ends include eps = -D and +D, so at
        // T = 0 the sampled band edges are the true ones and mu sits exactly mid-gap. rho = 1/(2D) is in the weights.
        ReadOnlySpan<double> x = [-1.0, -0.8717401485096066, -0.5917001814331423, -0.2092992179024789,
                                   0.2092992179024789, 0.5917001814331423, 0.8717401485096066, 1.0];
        ReadOnlySpan<double> w = [0.0357142857142857, 0.2107042271435061, 0.3411226924835044, 0.4124587946587038,
                                   0.4124587946587038, 0.3411226924835044, 0.2107042271435061, 0.0357142857142857];
        int panels = Math.Max(1, nodes / 8);
        double h = 2 * d / panels;
        var e = new double[panels * 8]; var wt = new double[panels * 8];
        for (int p = 0; p < panels; p++)
            for (int q = 0; q < 8; q++)
            {
                e[p * 8 + q] = -d + h * (p + 0.5 + 0.5 * x[q]);
                wt[p * 8 + q] = 0.5 * h * w[q] / (2 * d);
            }
        return (e, wt);
    }

    private static (double[], double[]) SemiEllipticNodes(double d, int nodes)
    {
        var e = new double[nodes]; var wt = new double[nodes];
        for (int i = 1; i <= nodes; i++)
        {
            double th = i * Math.PI / (nodes + 1), s = Math.Sin(th);
            e[i - 1] = d * Math.Cos(th);
            wt[i - 1] = 2.0 / (nodes + 1) * s * s; // (2/pi) * pi/(n+1) sin^2
        }
        return (e, wt);
    }

    public StateTable Fill(MeanFieldAmplitudes amplitudes)
    {
        var ham = new RenormalizedHamiltonian(_bare, amplitudes);
        int n = _n;
        var h0 = new Complex[n * n]; var s = new Complex[n * n];
        ham.Assemble(Vec3.Zero, h0, s);
        s.AsSpan().CopyTo(_scaled);
        _vectorsOf = ham;
        int chunks = Math.Max(1, Environment.ProcessorCount);
        Parallel.For(0, chunks, c =>
        {
            var solver = Eigensolvers.Create(n);
            var h = new Complex[n * n]; var v = new Complex[n * n]; var e = new double[n];
            int start = _eps.Length * c / chunks, end = _eps.Length * (c + 1) / chunks;
            for (int p = start; p < end; p++)
            {
                h0.AsSpan().CopyTo(h);
                for (int i = 0; i < n; i++) if (_conduction[i]) h[i * n + i] += _eps[p];
                solver.Solve(h, e, v);
                StateProjection.Store(_table, p * n, n, e, v, s, ham.Scale, _fIndex, _fGroup);
                v.AsSpan().CopyTo(_vectors.AsSpan(p * n * n, n * n));
            }
        });
        return _table;
    }

    public bool TryDerivatives(double mu, double temperature, double[] result)
    {
        if (_vectorsOf is not { } ham) return false;
        int n = _n, chunks = Math.Max(1, Environment.ProcessorCount);
        var parts = new StateDerivatives[chunks];
        Parallel.For(0, chunks, c =>
        {
            var acc = new StateDerivatives(n, _bare.GroupCount, _fIndex, _fGroup, _ffBonds);
            int start = _eps.Length * c / chunks, end = _eps.Length * (c + 1) / chunks;
            for (int p = start; p < end; p++)
                acc.Add(_table.Weight[p * n], _table.Energy.AsSpan(p * n, n), _vectors.AsSpan(p * n * n, n * n), _scaled, ham.Scale, mu, temperature);
            parts[c] = acc;
        });
        for (int c = 1; c < chunks; c++) parts[0].Merge(parts[c]);
        parts[0].Result(result);
        return true;
    }
}
