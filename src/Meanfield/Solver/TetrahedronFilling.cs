using Meanfield.Analysis.Dos;
using Meanfield.Lattices;

namespace Meanfield.Solver;

/// <summary>
/// T = 0 filling of bands on a Monkhorst-Pack mesh by the linear tetrahedron method (triangles for 2D lattices) with
/// Bloechl's correction (Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994); Lehmann &amp; Taut, Phys. Status Solidi B
/// 54, 469 (1972)). Bands are taken by energy order at every corner (common practice), each cell is cut as in
/// <see cref="MeshSimplices"/>. N(mu) = sum_T sum_n n_T(mu) / N_T is continuous and monotone; mu solves N(mu) = N_e
/// by safeguarded Newton with the tetrahedron DOS, or lies mid-gap when the count is met on an interval (a gap of the
/// interpolated bands, reported as a <see cref="FermiWindow"/>). The integration weights w_{k,n} then give every
/// T = 0 zone average as sum w F (n_f,g, dOmega/dr_g, Omega_band = sum w (E - mu)).
/// <para>
/// Hellmann-Feynman consistency: with linear tetrahedra Omega_lin = sum_T integral (E_lin - mu) theta(mu - E_lin), whose
/// derivative with respect to a corner energy is exactly its linear weight (the Fermi-surface term vanishes because
/// E - mu = 0 there) and whose mu-derivative is -N(mu); so with mu fixed by the count, sum w dE/dr is the exact gradient
/// of the discrete free energy. Bloechl's correction adds dw_i = sum_T D_T(mu)/40 sum_j (e_j - e_i) to the weights
/// (zero in insulators and in tetrahedra away from mu; it sums to zero, so N(mu) and mu are unchanged). It adds
/// -sum_T D_T(mu)/10 sum_i (e_i - mean e)^2 to Omega, whose corner derivative is 2 dw_i plus a term in dD_T/de_i,
/// not dw_i: with the correction the residuals equal the gradient of the corrected free energy only up to terms of
/// the size of the correction itself, which vanish with the mesh spacing as the correction does. The corrected weights
/// are used by default because they converge faster (their error falls faster than the h^2 of linear tetrahedra).
/// </para>
/// What it needs from the state table: the energy of every full-mesh k-point and band, E[k * Bands + n], k in
/// <see cref="KMesh.Index"/> order, bands ascending at each k. Nothing is stored per tetrahedron: cells are walked
/// with their corner indices computed on the fly, and cells whose 8 (2D: 4) corners lie on one side of mu are counted
/// whole. Memory: one weight per state, plus the lowest and highest corner energy of every cell for the bands that
/// can hold mu (one pass per solve; the Newton passes then read two numbers per cell and gather corners only where a
/// cell straddles mu). One instance serves one iteration: <see cref="Solve"/> is not re-entrant.
/// </summary>
public sealed class TetrahedronFilling
{
    /// <summary>A filling N_e within this of an integer (times max(1, N_e)) is integer: a gap may then hold mu.</summary>
    public const double IntegerFillingTolerance = 1e-10;
    /// <summary>Newton stops when |N(mu) - N_e| is below this times max(1, N_e).</summary>
    public const double CountTolerance = 1e-13;
    /// <summary>... or when the bracket on mu is narrower than this times the band range (rounding level).</summary>
    public const double BracketTolerance = 1e-15;
    /// <summary>A count missed by more than this times max(1, N_e) is reported (a dispersionless band at mu).</summary>
    public const double CountFailure = 1e-9;
    /// <summary>
    /// Simplices whose corner energies agree within this times the largest |E| are flat. On a shifted mesh the cell
    /// centred at Gamma (and, for even divisions, at the other points with coordinates 0 or 1/2) has all corners
    /// equivalent by symmetry, so the interpolated band is constant there and N(mu) jumps by 1/N_k per such cell and
    /// band; mu then stays at that energy and the flat simplices are filled partially, which keeps the occupations
    /// continuous in the amplitudes. The scale is the rounding of symmetry-equal eigenvalues.
    /// </summary>
    public const double FlatTolerance = 1e-11;
    private const int MaxSteps = 200;
    private double _scale, _flat;
    private readonly List<double> _flatLevels = [];
    private bool _pinned;
    private double[] _cellLo = [], _cellHi = [];
    private int _rangeFirst, _rangeBands;

    private readonly int _n1, _n2, _n3, _cellCorners, _perCell, _vertices;
    private readonly int[] _pattern;
    private readonly double[] _multiplicity;
    private readonly double[] _weights;
    private readonly double[] _bandMin, _bandMax;
    private readonly double _simplexWeight, _stateWeight;

    /// <summary>The mesh whose cells are cut.</summary>
    public KMesh Mesh { get; }
    /// <summary>Bands per k-point.</summary>
    public int Bands { get; }
    /// <summary>Whether Bloechl's correction is added to the weights (3D only; triangles have none).</summary>
    public bool BloechlCorrection { get; }
    /// <summary>Integration weight of every state after <see cref="Solve"/>, index k * Bands + n (sum = N(mu)).</summary>
    public ReadOnlySpan<double> Weights => _weights;
    /// <summary>Passes over the cells that evaluated N(mu) during the last <see cref="Solve"/> (the weight pass excluded).</summary>
    public int LastCountPasses { get; private set; }
    /// <summary>Wall seconds of the last <see cref="Solve"/> (count passes and weights).</summary>
    public double LastSeconds { get; private set; }

    /// <param name="mesh">A 2D or 3D Monkhorst-Pack mesh, Gamma-centred or shifted.</param>
    /// <param name="bands">Bands per k-point (at least 1).</param>
    /// <param name="bloechl">Add Bloechl's correction to the weights (default true; ignored in 2D).</param>
    /// <exception cref="ArgumentException">The lattice is neither 2D nor 3D, or bands &lt; 1.</exception>
    public TetrahedronFilling(KMesh mesh, int bands, bool bloechl = true)
    {
        if (bands < 1) throw new ArgumentException($"tetrahedron filling needs at least one band, got {bands}");
        Mesh = mesh; Bands = bands;
        _pattern = MeshSimplices.CellPattern(mesh);
        bool three = mesh.Lattice.Dimension == 3;
        BloechlCorrection = bloechl && three;
        _n1 = mesh.N1; _n2 = mesh.N2; _n3 = three ? mesh.N3 : 1;
        _cellCorners = three ? 8 : 4; _vertices = three ? 4 : 3; _perCell = _pattern.Length / _vertices;
        _multiplicity = new double[_cellCorners];
        foreach (var c in _pattern) _multiplicity[c] += 1;
        _simplexWeight = 1.0 / ((double)mesh.Count * _perCell);
        _stateWeight = 1.0 / mesh.Count;
        _weights = new double[mesh.Count * bands];
        _bandMin = new double[bands]; _bandMax = new double[bands];
    }

    /// <summary>
    /// Finds mu with N(mu) = N_e for the energies <paramref name="energies"/> (E[k * Bands + n], full mesh, bands
    /// ascending at each k) and fills <see cref="Weights"/>. <paramref name="muHint"/> (for example the last mu of an
    /// iteration) starts Newton when it lies inside the bracket.
    /// </summary>
    /// <exception cref="ArgumentException">Wrong number of energies.</exception>
    /// <exception cref="RequestError">N_e (the model's electrons_per_cell) outside [0, Bands].</exception>
    public TetrahedronFillingResult Solve(double[] energies, double electrons, double? muHint = null)
    {
        if (energies.Length != _weights.Length)
            throw new ArgumentException($"tetrahedron filling expects {_weights.Length} energies (mesh {Mesh} x {Bands} bands), got {energies.Length}");
        double tolerance = IntegerFillingTolerance * Math.Max(1.0, electrons);
        if (!(electrons >= -tolerance && electrons <= Bands + tolerance))
            throw new RequestError($"electrons_per_cell = {electrons:G6} exceeds the {Bands} bands sampled");
        long t0 = System.Diagnostics.Stopwatch.GetTimestamp();
        BandRanges(energies);
        _scale = Math.Max(Math.Max(Math.Abs(_bandMin[0]), Math.Abs(_bandMax[Bands - 1])), double.Epsilon);
        _flat = FlatTolerance * _scale;
        LastCountPasses = 0;
        int m = (int)Math.Round(electrons);
        bool integer = Math.Abs(electrons - m) <= tolerance;
        TetrahedronFillingResult result;
        if (integer && (m == 0 || m == Bands || _bandMax[m - 1] < _bandMin[m]))
        {
            // N(mu) = m on the whole gap [top of band m-1, bottom of band m]: every weight is 0 or 1/N_k.
            double lower = m == 0 ? _bandMin[0] : _bandMax[m - 1], upper = m == Bands ? _bandMax[Bands - 1] : _bandMin[m];
            for (int k = 0; k < Mesh.Count; k++)
                for (int n = 0; n < Bands; n++) _weights[k * Bands + n] = n < m ? _stateWeight : 0;
            result = new(0.5 * (lower + upper), new FermiWindow(lower, upper), m);
        }
        else
        {
            // Bands are ascending at every k, so band edges are ordered: N(bottom of band b) <= b and N(top of b) >= b+1.
            int b = integer ? m : (int)Math.Floor(electrons);
            double lo = _bandMin[b], hi = integer ? _bandMax[m - 1] : _bandMax[b];
            var (mu, flatFraction) = FindMu(energies, electrons, lo, hi, muHint);
            double count = FillWeights(energies, mu, flatFraction);
            result = new(mu, new FermiWindow(mu, mu), count);
        }
        LastSeconds = (System.Diagnostics.Stopwatch.GetTimestamp() - t0) / (double)System.Diagnostics.Stopwatch.Frequency;
        return result;
    }

    private void BandRanges(double[] energies)
    {
        Array.Fill(_bandMin, double.PositiveInfinity); Array.Fill(_bandMax, double.NegativeInfinity);
        for (int k = 0; k < Mesh.Count; k++)
            for (int n = 0; n < Bands; n++)
            {
                double e = energies[k * Bands + n];
                if (e < _bandMin[n]) _bandMin[n] = e;
                if (e > _bandMax[n]) _bandMax[n] = e;
            }
    }

    /// <summary>
    /// Safeguarded Newton on N(mu) = N_e inside [lo, hi]. Returns mu and the filled fraction of the flat simplices at
    /// mu (0 when there are none): when N(mu) jumps across N_e at the energy of flat simplices, mu stays there and they
    /// are filled partially, like a discrete level.
    /// </summary>
    private (double Mu, double FlatFraction) FindMu(double[] energies, double electrons, double lo, double hi, double? hint)
    {
        double tolerance = CountTolerance * Math.Max(1.0, electrons);
        double mu = hint is { } h && h > lo && h < hi ? h : 0.5 * (lo + hi);
        CellRanges(energies, lo, hi);
        for (int it = 0; it < MaxSteps; it++)
        {
            var (below, flat, dn) = Count(energies, mu);
            if (flat > 0 && electrons >= below - tolerance && electrons <= below + flat + tolerance)
            {
                // Report the level itself (mu is only within the flat tolerance of it), counted there again.
                foreach (var level in _flatLevels)
                    if (Math.Abs(level - mu) <= _flat && level != mu)
                    {
                        mu = level;
                        (below, flat, _) = Count(energies, mu);
                        break;
                    }
                return (mu, Math.Clamp((electrons - below) / flat, 0, 1));
            }
            double r = (electrons < below ? below : below + flat) - electrons;
            if (Math.Abs(r) < tolerance) return (mu, flat > 0 && r > 0 ? 1 : 0);
            if (r > 0) hi = mu; else lo = mu;
            if (hi - lo < BracketTolerance * _scale) return (0.5 * (lo + hi), 0);
            double next = dn > 0 ? mu - r / dn : double.NaN;
            mu = next > lo && next < hi ? next : 0.5 * (lo + hi);
            // N(mu) jumps at a flat level: try the level itself once it is bracketed (Newton would oscillate across).
            foreach (var level in _flatLevels)
                if (level > lo + _flat && level < hi - _flat) { mu = level; break; }
        }
        return (mu, 0);
    }

    /// <summary>
    /// One pass per solve over the cells of the bands that can hold mu in [lo, hi]: the lowest and highest corner
    /// energy of every cell and band (2 doubles per cell and band, so the Newton passes skip the cells away from mu
    /// with two reads), and the energies of flat cells (all corners within the flat tolerance: the cells centred on
    /// symmetric points of a shifted mesh, or a dispersionless band).
    /// </summary>
    private void CellRanges(double[] energies, double lo, double hi)
    {
        _rangeFirst = Active(lo).First;
        _rangeBands = Math.Max(1, Active(hi).Last - _rangeFirst);
        int size = Mesh.Count * _rangeBands;
        if (_cellLo.Length < size) { _cellLo = new double[size]; _cellHi = new double[size]; }
        int chunks = Chunks(1);
        Parallel.For(0, chunks, c =>
        {
            Span<int> corner = stackalloc int[8];
            Span<double> cell = stackalloc double[8];
            for (int i1 = _n1 * c / chunks; i1 < _n1 * (c + 1) / chunks; i1++)
                for (int i2 = 0; i2 < _n2; i2++)
                    for (int i3 = 0; i3 < _n3; i3++)
                    {
                        int index = (i1 * _n2 + i2) * _n3 + i3;
                        CellCorners(i1, i2, i3, corner);
                        for (int b = 0; b < _rangeBands; b++)
                        {
                            var (a, z) = Gather(energies, corner, _rangeFirst + b, cell);
                            _cellLo[index * _rangeBands + b] = a; _cellHi[index * _rangeBands + b] = z;
                        }
                    }
        });
        _flatLevels.Clear();
        for (int i = 0; i < size; i++)
        {
            double a = _cellLo[i], z = _cellHi[i];
            if (z - a > _flat || z < lo || a > hi) continue;
            double level = 0.5 * (a + z);
            bool known = false;
            foreach (var l in _flatLevels) known |= Math.Abs(l - level) <= _flat;
            if (!known) _flatLevels.Add(level);
        }
    }

    /// <summary>Bands wholly below mu and the [first, last) range of bands that straddle it.</summary>
    private (int Full, int First, int Last) Active(double mu)
    {
        int first = 0;
        while (first < Bands && _bandMax[first] < mu - _flat) first++;
        int last = first;
        while (last < Bands && _bandMin[last] < mu + _flat) last++;
        return (first, first, last);
    }

    /// <summary>
    /// N(mu) without the flat simplices at mu, their count (both in electrons per cell) and the tetrahedron DOS
    /// dN/dmu, parallel over slabs of cells.
    /// </summary>
    private (double Below, double Flat, double D) Count(double[] energies, double mu)
    {
        LastCountPasses++;
        var (full, first, last) = Active(mu);
        if (first == last) return (full, 0, 0);
        int chunks = Chunks(1);
        var partial = new double[3 * chunks];
        Parallel.For(0, chunks, c =>
        {
            var (f, flat, d) = CountSlab(energies, mu, first, last, _n1 * c / chunks, _n1 * (c + 1) / chunks);
            partial[3 * c] = f; partial[3 * c + 1] = flat; partial[3 * c + 2] = d;
        });
        double sf = 0, sflat = 0, sd = 0;
        for (int c = 0; c < chunks; c++) { sf += partial[3 * c]; sflat += partial[3 * c + 1]; sd += partial[3 * c + 2]; }
        return (full + sf * _simplexWeight, sflat * _simplexWeight, sd * _simplexWeight);
    }

    /// <summary>A simplex whose corners agree within the flat tolerance and sit within it of mu.</summary>
    private bool FlatAtMu(ReadOnlySpan<double> sorted, double mu) =>
        sorted[_vertices - 1] - sorted[0] <= _flat && sorted[0] <= mu + _flat && sorted[_vertices - 1] >= mu - _flat;

    private (double Fraction, double Flat, double D) CountSlab(double[] energies, double mu, int first, int last, int i1Start, int i1End)
    {
        Span<int> corner = stackalloc int[8];
        Span<double> cell = stackalloc double[8];
        Span<double> e = stackalloc double[4];
        double fraction = 0, flat = 0, dos = 0, below = mu - _flat, above = mu + _flat;
        for (int i1 = i1Start; i1 < i1End; i1++)
            for (int i2 = 0; i2 < _n2; i2++)
                for (int i3 = 0; i3 < _n3; i3++)
                {
                    int range = ((i1 * _n2 + i2) * _n3 + i3) * _rangeBands - _rangeFirst;
                    bool corners = false;
                    for (int n = first; n < last; n++)
                    {
                        if (_cellHi[range + n] < below) { fraction += _perCell; continue; }
                        if (_cellLo[range + n] > above) continue;
                        if (!corners) { CellCorners(i1, i2, i3, corner); corners = true; }
                        Gather(energies, corner, n, cell);
                        for (int s = 0; s < _perCell; s++)
                        {
                            for (int v = 0; v < _vertices; v++) e[v] = cell[_pattern[s * _vertices + v]];
                            if (_vertices == 4) Sort4(e); else Sort3(e);
                            if (FlatAtMu(e, mu)) { flat += 1; continue; }
                            if (_vertices == 4)
                            {
                                var (f, d) = SimplexKernel.TetraFractionAndDensity(e, mu);
                                fraction += f; dos += d;
                            }
                            else { fraction += SimplexKernel.TriangleFraction(e, mu); dos += SimplexKernel.TriangleDensity(e, mu); }
                        }
                    }
                }
        return (fraction, flat, dos);
    }

    /// <summary>
    /// Weights at mu, with the flat simplices at mu filled to <paramref name="flatFraction"/>. Every state starts at
    /// 1/N_k if E &lt; mu, else 0 (exact for k-points whose cells all lie on one side of mu); the cells that straddle
    /// mu then replace that share of their corners by their simplex weights. Those cells write to the k-points of
    /// their own and the next plane, so even slabs run in parallel, then odd ones (no two running slabs share a plane,
    /// nothing is stored per thread). Returns N(mu), the sum of the weights.
    /// </summary>
    private double FillWeights(double[] energies, double mu, double flatFraction)
    {
        _pinned = flatFraction > 0 && flatFraction < 1;
        var (_, first, last) = Active(mu);
        for (int k = 0; k < Mesh.Count; k++)
            for (int n = 0; n < Bands; n++)
            {
                int s = k * Bands + n;
                _weights[s] = n < first ? _stateWeight : n < last && energies[s] < mu ? _stateWeight : 0;
            }
        if (first < last)
        {
            int chunks = Chunks(2);
            if (chunks < 2) WeightSlab(energies, mu, flatFraction, first, last, 0, _n1);
            else
                for (int phase = 0; phase < 2; phase++)
                    Parallel.For(0, chunks / 2, j =>
                    {
                        int c = 2 * j + phase;
                        WeightSlab(energies, mu, flatFraction, first, last, _n1 * c / chunks, _n1 * (c + 1) / chunks);
                    });
        }
        double count = 0;
        foreach (var w in _weights) count += w;
        return count;
    }

    private void WeightSlab(double[] energies, double mu, double flatFraction, int first, int last, int i1Start, int i1End)
    {
        Span<int> corner = stackalloc int[8];
        Span<double> cell = stackalloc double[8];
        Span<double> e = stackalloc double[4];
        Span<double> w = stackalloc double[4];
        Span<int> order = stackalloc int[4];
        double share = _simplexWeight / _vertices, below = mu - _flat, above = mu + _flat;
        for (int i1 = i1Start; i1 < i1End; i1++)
            for (int i2 = 0; i2 < _n2; i2++)
                for (int i3 = 0; i3 < _n3; i3++)
                {
                    int range = ((i1 * _n2 + i2) * _n3 + i3) * _rangeBands - _rangeFirst;
                    bool corners = false;
                    for (int n = first; n < last; n++)
                    {
                        if (_cellHi[range + n] < below || _cellLo[range + n] > above) continue;
                        if (!corners) { CellCorners(i1, i2, i3, corner); corners = true; }
                        Gather(energies, corner, n, cell);
                        // Undo the starting share of this cell's occupied corners.
                        for (int c = 0; c < _cellCorners; c++)
                            if (cell[c] < mu) _weights[corner[c] * Bands + n] -= _multiplicity[c] * share;
                        for (int s = 0; s < _perCell; s++)
                        {
                            for (int v = 0; v < _vertices; v++) { order[v] = _pattern[s * _vertices + v]; e[v] = cell[order[v]]; }
                            SortWithOrder(e, order, _vertices);
                            if (FlatAtMu(e, mu))
                            {
                                for (int v = 0; v < _vertices; v++) _weights[corner[order[v]] * Bands + n] += flatFraction * share;
                                continue;
                            }
                            if (_vertices == 4)
                            {
                                SimplexKernel.TetraIntegrationWeights(e, mu, w);
                                if (BloechlCorrection)
                                {
                                    // Bloechl et al. 1994, Eq. (22): dw_i = D_T(mu)/40 sum_j (e_j - e_i).
                                    double d = BloechlDensity(e, mu, flatFraction) / 40, sum = e[0] + e[1] + e[2] + e[3];
                                    for (int v = 0; v < 4; v++) w[v] += d * (sum - 4 * e[v]);
                                }
                            }
                            else SimplexKernel.TriangleIntegrationWeights(e, mu, w);
                            for (int v = 0; v < _vertices; v++) _weights[corner[order[v]] * Bands + n] += _simplexWeight * w[v];
                        }
                    }
                }
    }

    /// <summary>
    /// D_T(mu) for Bloechl's correction. A tetrahedron that shares the flat cell's corners has its DOS jump at the flat
    /// level; while mu is pinned there, the flat fraction x plays the role of the position inside the jump, so D is
    /// taken as (1 - x) D(level-) + x D(level+), which keeps the weights continuous as x runs from 0 to 1.
    /// </summary>
    private double BloechlDensity(ReadOnlySpan<double> e, double mu, double flatFraction)
    {
        if (!_pinned) return SimplexKernel.TetraFractionAndDensity(e, mu).D;
        return (1 - flatFraction) * SimplexKernel.TetraFractionAndDensity(e, mu - 2 * _flat).D
               + flatFraction * SimplexKernel.TetraFractionAndDensity(e, mu + 2 * _flat).D;
    }

    /// <summary>Slabs along i1: as many as cores (times <paramref name="factor"/>), each at least one plane thick.</summary>
    private int Chunks(int factor)
    {
        int chunks = Math.Min(factor * Math.Max(1, Environment.ProcessorCount), _n1);
        if (factor == 2) chunks -= chunks % 2;
        return Math.Max(1, chunks);
    }

    private void CellCorners(int i1, int i2, int i3, Span<int> corner)
    {
        int j1 = i1 + 1 == _n1 ? 0 : i1 + 1, j2 = i2 + 1 == _n2 ? 0 : i2 + 1, j3 = i3 + 1 == _n3 ? 0 : i3 + 1;
        for (int c = 0; c < _cellCorners; c++)
        {
            int a1 = (c & 1) != 0 ? j1 : i1, a2 = (c & 2) != 0 ? j2 : i2, a3 = (c & 4) != 0 ? j3 : i3;
            corner[c] = (a1 * _n2 + a2) * _n3 + a3;
        }
    }

    private (double Lo, double Hi) Gather(double[] energies, ReadOnlySpan<int> corner, int n, Span<double> cell)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        for (int c = 0; c < _cellCorners; c++)
        {
            double v = energies[corner[c] * Bands + n];
            cell[c] = v;
            if (v < lo) lo = v;
            if (v > hi) hi = v;
        }
        return (lo, hi);
    }

    private static void Swap(Span<double> e, int i, int j)
    {
        if (e[i] > e[j]) (e[i], e[j]) = (e[j], e[i]);
    }

    private static void Sort4(Span<double> e)
    {
        Swap(e, 0, 1); Swap(e, 2, 3); Swap(e, 0, 2); Swap(e, 1, 3); Swap(e, 1, 2);
    }

    private static void Sort3(Span<double> e)
    {
        Swap(e, 0, 1); Swap(e, 1, 2); Swap(e, 0, 1);
    }

    private static void SortWithOrder(Span<double> e, Span<int> order, int n)
    {
        for (int i = 1; i < n; i++)
        {
            double v = e[i]; int o = order[i], j = i - 1;
            while (j >= 0 && e[j] > v) { e[j + 1] = e[j]; order[j + 1] = order[j]; j--; }
            e[j + 1] = v; order[j + 1] = o;
        }
    }
}

/// <summary>The outcome of <see cref="TetrahedronFilling.Solve"/>.</summary>
/// <param name="Mu">Chemical potential (energy unit): mid-window in a gap.</param>
/// <param name="Window">All mu with N(mu) = N_e (a single point for a metal).</param>
/// <param name="Electrons">N(mu) reached: N_e to rounding, unless a dispersionless band sits at mu.</param>
public readonly record struct TetrahedronFillingResult(double Mu, FermiWindow Window, double Electrons);
