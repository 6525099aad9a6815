using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// Total DOS of a 3D Bloch source by the linear tetrahedron method on a mesh refined where it matters: a Gamma-centred
/// base mesh whose cells (parallelepipeds in reduced coordinates) are split into eight, level after level, wherever the
/// bands near a reference energy are not linear enough for the energies they carry (<see cref="AdaptiveMeshOptions"/>).
/// Every leaf cell is cut into six tetrahedra around its shortest main diagonal, as on the uniform mesh (Bloechl,
/// Jepsen &amp; Andersen, PRB 49, 16223 (1994), Sec. II); the leaves tile the zone exactly, so the integrated DOS is the
/// exact state count of the piecewise-linear bands and the T = 0 count of a semimetal lands on its node.
/// </summary>
/// <remarks>
/// Why: a band touching (Weyl cone) has rho ~ E^2, and a uniform mesh of spacing dk resolves it only above E ~ v dk.
/// Refining until the interpolation error is a small fraction of |E - E_ref| grades the mesh geometrically towards the
/// node (cell size proportional to the distance), which resolves the E^2 law at every energy down to the floor at a
/// cost that grows only with the logarithm of the energy range. Non-conforming faces between cells of different levels
/// do not matter: each tetrahedron's DOS is computed on its own. Only bands that come within the window of the
/// reference are refined; the others are integrated on the base mesh. The interpolation error of a cell is estimated
/// from values it needs anyway: the centre (a corner of its children) against the mean of the diagonal's ends, and the
/// non-linear (bilinear and trilinear) part of the eight corner values.
/// </remarks>
public sealed class AdaptiveTetrahedronDos
{
    // Deepest refinement: the integer corner lattice n0 * 2^levels must fit 21 bits per axis (three axes in one long).
    private const int CoordinateBits = 21;
    private static readonly int[][] KuhnPaths = [[1, 2, 4], [1, 4, 2], [2, 1, 4], [2, 4, 1], [4, 1, 2], [4, 2, 1]];

    private readonly IBlochSource _source;
    private readonly Lattice _lattice;
    private readonly int _n0, _levels, _res, _start;
    private readonly int _first, _active; // refined bands: [_first, _first + _active)
    private readonly MeshSpectrum _base;
    private readonly MeshSimplices _baseSimplices;
    private readonly Dictionary<long, int> _index = new();
    private double[] _energy = []; // _energy[corner * _active + a]
    private int _corners;
    private readonly List<int> _leafCorners = []; // eight per leaf
    private readonly List<byte> _leafLevel = [];
    private readonly List<int> _leafCentre = [];
    private readonly List<(int X, int Y, int Z)> _leafOrigin = []; // -1 when the leaf's centre was never diagonalised

    /// <summary>The options the mesh was refined with.</summary>
    public AdaptiveMeshOptions Options { get; private set; }
    /// <summary>Number of leaf cells (six tetrahedra each).</summary>
    public int Leaves => _leafLevel.Count;
    /// <summary>Distinct k-points diagonalised (base mesh, refined corners and cell centres).</summary>
    public int KPoints => _corners;
    /// <summary>Deepest level reached (0 = base mesh; the cell edge is the base edge / 2^level).</summary>
    public int DeepestLevel { get; private set; }
    /// <summary>Bands refined (0-based, first and count); the others are integrated on the base mesh.</summary>
    public (int First, int Count) RefinedBands => (_first, _active);
    /// <summary>True when the cell budget or the deepest level stopped the refinement before every cell met the
    /// tolerance; <see cref="WorstRemainingRatio"/> then says by how much the worst cell misses it.</summary>
    public bool BudgetExhausted { get; private set; }
    /// <summary>Largest (interpolation error / allowed error) over the leaves within the window (at most 1 unless
    /// <see cref="BudgetExhausted"/>).</summary>
    public double WorstRemainingRatio { get; private set; }
    /// <summary>Number of bands of the source.</summary>
    public int Bands { get; }

    /// <summary>
    /// Diagonalises the base mesh, then refines; <see cref="ArgumentException"/> for a lattice that is not 3D or options
    /// out of range. Cost: one diagonalisation per corner and per cell centre, in parallel over k.
    /// </summary>
    public AdaptiveTetrahedronDos(IBlochSource source, AdaptiveMeshOptions options)
    {
        options.Validate();
        _source = source;
        _lattice = source.Model.Lattice;
        if (_lattice.Dimension != 3) throw new ArgumentException("the adaptive tetrahedron DOS needs a 3D lattice");
        Options = options;
        _n0 = options.BaseMesh;
        _levels = 0;
        while ((long)_n0 << (_levels + 1) < 1L << CoordinateBits) _levels++;
        _res = _n0 << _levels;
        Bands = source.Size;
        var mesh = new KMesh(_lattice, _n0);
        _base = MeshSpectrum.Compute(source, mesh, withProjections: false);
        _baseSimplices = MeshSimplices.Build(mesh);
        _start = KuhnStart(_lattice);
        (_first, _active) = ActiveBands(options);
        var cells = BaseCells(mesh);
        if (_active > 0) Refine(cells);
        else foreach (var c in cells) AddLeaf(c);
    }

    private readonly record struct Cell(int X, int Y, int Z, int Level, int[] Corners)
    {
        public int Centre { get; init; } = -1;
    }

    // The twelve tetrahedra of a cell around its centre: each face (corners in cyclic order) cut along one diagonal
    // into two triangles, each joined to the centre; every one holds 1/12 of the cell.
    private static readonly int[][] FaceTriangles =
    [
        [0, 2, 6], [0, 6, 4], [1, 3, 7], [1, 7, 5], [0, 1, 5], [0, 5, 4],
        [2, 3, 7], [2, 7, 6], [0, 1, 3], [0, 3, 2], [4, 5, 7], [4, 7, 6],
    ];

    // ---- construction ------------------------------------------------------------------------------------------

    private static int KuhnStart(Lattice lattice)
    {
        Vec3 Step(int bits) => lattice.Cartesian(bits & 1, (bits >> 1) & 1, (bits >> 2) & 1);
        int start = 0; double best = double.PositiveInfinity;
        for (int c0 = 0; c0 < 4; c0++)
        {
            double len = (Step(c0 ^ 7) - Step(c0)).Norm;
            if (len < best - 1e-12 * best) { best = len; start = c0; }
        }
        return start;
    }

    // Bands with some base cell reaching the window; a cell's range is widened by half its spread, since values
    // inside a cell may pass its corners'.
    private (int First, int Count) ActiveBands(AdaptiveMeshOptions o)
    {
        int bands = Bands, first = -1, last = -1;
        var mesh = _base.Mesh;
        double lowEdge = o.ReferenceEnergy - o.Window, highEdge = o.ReferenceEnergy + o.Window;
        for (int b = 0; b < bands; b++)
        {
            bool reaches = false;
            for (int i1 = 0; i1 < _n0 && !reaches; i1++)
                for (int i2 = 0; i2 < _n0 && !reaches; i2++)
                    for (int i3 = 0; i3 < _n0 && !reaches; i3++)
                    {
                        double cl = double.PositiveInfinity, ch = double.NegativeInfinity;
                        for (int c = 0; c < 8; c++)
                        {
                            double e = _base.Energy(mesh.Index(i1 + (c & 1), i2 + ((c >> 1) & 1), i3 + ((c >> 2) & 1)), b);
                            cl = Math.Min(cl, e); ch = Math.Max(ch, e);
                        }
                        double margin = 0.5 * (ch - cl);
                        reaches = ch + margin >= lowEdge && cl - margin <= highEdge;
                    }
            if (reaches)
            {
                if (first < 0) first = b;
                last = b;
            }
        }
        return first < 0 ? (0, 0) : (first, last - first + 1);
    }

    private List<Cell> BaseCells(KMesh mesh)
    {
        int scale = 1 << _levels;
        var baseCorner = new int[mesh.Count];
        EnsureCapacity(mesh.Count);
        for (int k = 0; k < mesh.Count; k++)
        {
            int i3 = k % _n0, i2 = k / _n0 % _n0, i1 = k / (_n0 * _n0);
            int id = _corners++;
            _index[Key(i1 * scale, i2 * scale, i3 * scale)] = id;
            for (int a = 0; a < _active; a++) _energy[id * _active + a] = _base.Energy(k, _first + a);
            baseCorner[k] = id;
        }
        var cells = new List<Cell>(mesh.Count);
        for (int i1 = 0; i1 < _n0; i1++)
            for (int i2 = 0; i2 < _n0; i2++)
                for (int i3 = 0; i3 < _n0; i3++)
                {
                    var corners = new int[8];
                    for (int c = 0; c < 8; c++)
                        corners[c] = baseCorner[mesh.Index(i1 + (c & 1), i2 + ((c >> 1) & 1), i3 + ((c >> 2) & 1))];
                    cells.Add(new Cell(i1 * scale, i2 * scale, i3 * scale, 0, corners));
                }
        return cells;
    }

    private long Key(int x, int y, int z)
    {
        x = ((x % _res) + _res) % _res; y = ((y % _res) + _res) % _res; z = ((z % _res) + _res) % _res;
        return ((long)x << (2 * CoordinateBits)) | ((long)y << CoordinateBits) | (long)z;
    }

    private void EnsureCapacity(int more)
    {
        long need = (long)(_corners + more) * _active;
        if (need > _energy.Length) Array.Resize(ref _energy, (int)Math.Max(need, Math.Min(int.MaxValue / 2, 2L * _energy.Length)));
    }

    // Diagonalises the points (integer coordinates) not yet in the table and returns the corner id of each.
    private int[] Corners(IReadOnlyList<(int X, int Y, int Z)> points)
    {
        var ids = new int[points.Count];
        var fresh = new List<(int Index, int X, int Y, int Z)>();
        for (int i = 0; i < points.Count; i++)
        {
            var (x, y, z) = points[i];
            long key = Key(x, y, z);
            if (_index.TryGetValue(key, out int id)) ids[i] = id;
            else
            {
                id = _corners + fresh.Count;
                _index[key] = id; ids[i] = id;
                fresh.Add((id, x, y, z));
            }
        }
        EnsureCapacity(fresh.Count);
        double inv = 1.0 / _res;
        int first = _first, active = _active;
        var energy = _energy;
        Parallel.For(0, fresh.Count, () => new BlochWorkspace(_source), (i, _, ws) =>
        {
            var (id, x, y, z) = fresh[i];
            ws.Solve(_lattice.Cartesian(x * inv, y * inv, z * inv), false);
            for (int a = 0; a < active; a++) energy[id * active + a] = ws.Values[first + a];
            return ws;
        }, _ => { });
        _corners += fresh.Count;
        return ids;
    }

    // Splits cells (of any levels) until each meets the tolerance, the deepest level or the budget.
    private void Refine(List<Cell> cells)
    {
        var o = Options;
        long created = _leafLevel.Count + cells.Count;
        WorstRemainingRatio = 0;
        while (cells.Count > 0)
        {
            foreach (var c in cells) DeepestLevel = Math.Max(DeepestLevel, c.Level);
            var ratio = Ratios(cells);
            var split = new List<int>();
            for (int i = 0; i < cells.Count; i++) if (ratio[i] > 1 && cells[i].Level < _levels) split.Add(i);
            long room = (o.MaxCells - created) / 8;
            if (split.Count > room)
            {
                // Over budget: the worst cells are split, the rest stay as they are (and say so).
                split.Sort((a, b) => ratio[b].CompareTo(ratio[a]));
                split = split.GetRange(0, (int)Math.Max(room, 0));
            }
            var isSplit = new bool[cells.Count];
            foreach (int i in split) isSplit[i] = true;
            for (int i = 0; i < cells.Count; i++)
                if (!isSplit[i]) { AddLeaf(cells[i]); WorstRemainingRatio = Math.Max(WorstRemainingRatio, ratio[i]); }
            if (split.Count == 0) break;
            var points = new List<(int, int, int)>(27 * split.Count);
            foreach (int i in split)
            {
                var c = cells[i];
                int half = 1 << (_levels - c.Level - 1);
                for (int b = 0; b < 27; b++) points.Add((c.X + (b % 3) * half, c.Y + (b / 3 % 3) * half, c.Z + (b / 9) * half));
            }
            var ids = Corners(points);
            var next = new List<Cell>(8 * split.Count);
            for (int s = 0; s < split.Count; s++)
            {
                var c = cells[split[s]];
                int half = 1 << (_levels - c.Level - 1);
                for (int child = 0; child < 8; child++)
                {
                    int cx = child & 1, cy = (child >> 1) & 1, cz = (child >> 2) & 1;
                    var corners = new int[8];
                    for (int q = 0; q < 8; q++)
                        corners[q] = ids[27 * s + (cx + (q & 1)) + 3 * (cy + ((q >> 1) & 1)) + 9 * (cz + ((q >> 2) & 1))];
                    next.Add(new Cell(c.X + cx * half, c.Y + cy * half, c.Z + cz * half, c.Level + 1, corners));
                }
            }
            created += 8L * split.Count;
            cells = next;
        }
        BudgetExhausted = WorstRemainingRatio > 1;
    }

    /// <summary>
    /// Refines further for a new reference energy (for example the exact Fermi level once it is known): every leaf is
    /// tested again and split where it misses the tolerance. k-points already diagonalised are reused.
    /// </summary>
    public void Recentre(double referenceEnergy)
    {
        if (!double.IsFinite(referenceEnergy)) throw new ArgumentException("the reference energy must be finite");
        Options = Options with { ReferenceEnergy = referenceEnergy };
        if (_active == 0) return;
        var cells = new List<Cell>(Leaves);
        for (int i = 0; i < Leaves; i++)
        {
            var corners = _leafCorners.GetRange(8 * i, 8).ToArray();
            var (x, y, z) = _leafOrigin[i];
            cells.Add(new Cell(x, y, z, _leafLevel[i], corners));
        }
        _leafCorners.Clear(); _leafLevel.Clear(); _leafCentre.Clear(); _leafOrigin.Clear();
        Refine(cells);
    }

    private void AddLeaf(Cell c)
    {
        _leafCorners.AddRange(c.Corners);
        _leafLevel.Add((byte)c.Level);
        _leafCentre.Add(c.Centre);
        _leafOrigin.Add((c.X, c.Y, c.Z));
    }

    // Interpolation error over allowed error for each cell; the centre of each cell (a corner of its children) is
    // diagonalised here, except on the deepest level, which is never split.
    private double[] Ratios(List<Cell> cells)
    {
        var o = Options;
        var ratio = new double[cells.Count];
        var pts = new List<(int, int, int)>(cells.Count);
        var at = new List<int>(cells.Count);
        for (int i = 0; i < cells.Count; i++)
        {
            var c = cells[i];
            if (c.Level >= _levels) continue;
            int half = 1 << (_levels - c.Level - 1);
            pts.Add((c.X + half, c.Y + half, c.Z + half)); at.Add(i);
        }
        var centres = Corners(pts);
        for (int j = 0; j < at.Count; j++) cells[at[j]] = cells[at[j]] with { Centre = centres[j] };
        Parallel.For(0, cells.Count, i => ratio[i] = CornerRatio(cells[i].Corners, cells[i].Centre, o));
        return ratio;
    }

    private double CornerRatio(int[] corners, int centre, AdaptiveMeshOptions o)
    {
        double worst = 0;
        int diagA = corners[_start], diagB = corners[_start ^ 7];
        for (int a = 0; a < _active; a++)
        {
            double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
            double xy = 0, yz = 0, zx = 0, xyz = 0;
            for (int q = 0; q < 8; q++)
            {
                double e = _energy[corners[q] * _active + a];
                lo = Math.Min(lo, e); hi = Math.Max(hi, e);
                int sx = (q & 1) == 1 ? 1 : -1, sy = (q & 2) != 0 ? 1 : -1, sz = (q & 4) != 0 ? 1 : -1;
                xy += sx * sy * e; yz += sy * sz * e; zx += sz * sx * e; xyz += sx * sy * sz * e;
            }
            // Non-linear part of the corner values (Walsh components beyond 1, x, y, z): an upper bound of the
            // largest deviation of a corner from the best linear fit.
            double err = (Math.Abs(xy) + Math.Abs(yz) + Math.Abs(zx) + Math.Abs(xyz)) / 8;
            if (centre >= 0)
            {
                double ec = _energy[centre * _active + a];
                lo = Math.Min(lo, ec); hi = Math.Max(hi, ec);
                double mid = 0.5 * (_energy[diagA * _active + a] + _energy[diagB * _active + a]);
                err = Math.Max(err, Math.Abs(ec - mid));
            }
            double d = Math.Max(0, Math.Max(lo - o.ReferenceEnergy, o.ReferenceEnergy - hi));
            if (d > o.Window) continue;
            double allowed = Math.Max(Math.Max(o.RelativeTolerance * d, o.FloorTolerance * o.Floor), o.LinearityTolerance * (hi - lo));
            worst = Math.Max(worst, err / allowed);
        }
        return worst;
    }

    /// <summary>Leaf cells per level (index = level).</summary>
    public int[] LeafLevels()
    {
        var n = new int[DeepestLevel + 1];
        foreach (var l in _leafLevel) n[l]++;
        return n;
    }

    /// <summary>Smallest and largest eigenvalue over every k-point diagonalised (energy unit).</summary>
    public (double Min, double Max) SpectrumRange()
    {
        var (lo, hi) = _base.Range();
        for (long i = 0; i < (long)_corners * _active; i++) { lo = Math.Min(lo, _energy[i]); hi = Math.Max(hi, _energy[i]); }
        return (lo, hi);
    }

    // ---- integration -------------------------------------------------------------------------------------------

    /// <summary>
    /// Total DOS and exact state count at the given ascending energies (any spacing), one pass over the tetrahedra.
    /// </summary>
    /// <exception cref="ArgumentException">Fewer than 2 energies, or energies not strictly ascending.</exception>
    public TotalDensityOfStates Compute(IReadOnlyList<double> energies)
    {
        if (energies.Count < 2) throw new ArgumentException("a DOS needs at least 2 energies");
        var grid = energies.ToArray();
        for (int i = 1; i < grid.Length; i++)
            if (!(grid[i] > grid[i - 1])) throw new ArgumentException($"energy {i}: energies must be strictly ascending");
        int n = grid.Length;
        var total = new double[n];
        var partial = new double[n];
        var steps = new double[n + 1];
        var gate = new object();
        Sweep(() => new Accumulate(grid), (acc, e, w, _) => acc.Add(e, w), acc =>
        {
            lock (gate)
                for (int i = 0; i < n; i++) { total[i] += acc.Total[i]; partial[i] += acc.Partial[i]; steps[i] += acc.Steps[i]; }
        });
        var integrated = new double[n];
        double run = 0;
        for (int i = 0; i < n; i++) { run += steps[i]; integrated[i] = run + partial[i]; }
        return new TotalDensityOfStates(grid, total, integrated, Describe());
    }

    /// <summary>The DOS on a uniform grid (see <see cref="Compute(IReadOnlyList{double})"/>).</summary>
    public TotalDensityOfStates Compute(EnergyGrid grid)
    {
        grid.Validate();
        var e = new double[grid.Points];
        for (int i = 0; i < e.Length; i++) e[i] = grid.Minimum + i * grid.Step;
        return Compute(e);
    }

    /// <summary>The method in words, for file headers.</summary>
    public string Describe() =>
        $"linear tetrahedron method on an adaptive mesh (base {_n0}^3 Gamma-centred, {Leaves} cells, deepest level {DeepestLevel}, "
        + (_active > 0 ? $"bands {_first}-{_first + _active - 1} refined)" : "no band refined)");

    /// <summary>
    /// The T = 0 Fermi level for <paramref name="electrons"/> per cell: where the exact state count reaches it, the
    /// middle of the plateau when it is reached across a gap (energy unit), with the DOS there. The search starts from
    /// a <paramref name="bracket"/> (lo, hi) that holds it, when known (for example two grid energies of a computed DOS).
    /// </summary>
    /// <exception cref="RequestError">The count (the model's electrons_per_cell) lies outside (0, bands).</exception>
    /// <exception cref="ArgumentException">The count lies outside the bracket.</exception>
    public (double Energy, double Dos) FermiLevel(double electrons, (double Lo, double Hi)? bracket = null)
    {
        if (!(electrons > 0 && electrons < Bands)) throw new RequestError($"electrons_per_cell = {electrons:G6}: the DOS needs 0 < N < {Bands} (bands on the mesh)");
        double tol = 1e-9 * Math.Max(1, electrons);
        var (lo, hi) = bracket ?? Widen(SpectrumRange());
        // Zoom with DOS grids until few tetrahedra straddle the bracket, then bisect on those alone.
        const int points = 65;
        for (int pass = 0; pass < 12 && StraddlingCount(lo, hi) > StraddleLimit; pass++)
        {
            var dos = Compute(new EnergyGrid(lo, hi, points));
            int a = 0, b = points - 1;
            while (a < points - 1 && dos.Integrated[a + 1] < electrons - tol) a++;
            while (b > 0 && dos.Integrated[b - 1] > electrons + tol) b--;
            (lo, hi) = (dos.Energies[a], dos.Energies[Math.Max(b, a + 1)]);
        }
        int occupied = Math.Abs(electrons - Math.Round(electrons)) < tol ? (int)Math.Round(electrons) : -1;
        var list = Straddling(lo, hi, occupied);
        double target = occupied >= 0 ? 0 : electrons; // the list counts the excess over N at integer filling
        if (list.Count(lo) > target + tol || list.Count(hi) < target - tol)
            throw new ArgumentException($"the Fermi level for {electrons} electrons lies outside [{lo}, {hi}]");
        // Where the exact count crosses N_e (no tolerance: near a node the count departs from N_e only as E^3, so a
        // tolerance would widen the answer to a false plateau) ...
        double below = lo, above = hi;
        for (int it = 0; it < 200 && above - below > 1e-15 * Math.Max(1, Math.Abs(above)); it++)
        {
            double mid = 0.5 * (below + above);
            if (list.Count(mid) < target) below = mid; else above = mid;
        }
        double energy = 0.5 * (below + above);
        // ... unless it falls in a true gap (no tetrahedron holds states there): then the middle of the gap.
        if (list.Density(energy) == 0)
        {
            double gapLo = lo, gapHi = hi;
            var e = list.Energies;
            for (int t = 0; t < list.Weights.Count; t++)
            {
                double bottom = e[4 * t], top = e[4 * t + 3];
                if (top <= energy) gapLo = Math.Max(gapLo, top);
                else if (bottom >= energy) gapHi = Math.Min(gapHi, bottom);
            }
            energy = 0.5 * (gapLo + gapHi);
        }
        return (energy, list.Density(energy));
    }

    private const int StraddleLimit = 200_000;

    private static (double, double) Widen((double Lo, double Hi) r)
    {
        double pad = 1e-6 * Math.Max(r.Hi - r.Lo, Math.Abs(r.Hi) + Math.Abs(r.Lo)) + 1e-300;
        return (r.Lo - pad, r.Hi + pad);
    }

    // The tetrahedra whose energy range meets (lo, hi), enough to evaluate the count and the DOS inside the bracket.
    // With an integer filling N the count is kept as the excess over N: electrons in bands >= N minus holes in bands
    // &lt; N, each a sum of small positive terms, so it stays exact near a node, where it departs from zero only as
    // E^3 (a plain count would drown that in the rounding of N). Otherwise the plain count below lo is kept.
    private sealed class StraddleList(int occupied)
    {
        public double Offset; // excess (or count) from the tetrahedra wholly outside the bracket
        public readonly List<double> Weights = []; // negative for a band counted by its holes
        public readonly List<double> Energies = [];

        public void Add(double[] e, double w, int band, double lo, double hi)
        {
            bool holes = occupied >= 0 && band < occupied;
            if (e[3] <= lo) { if (occupied < 0 || !holes) Offset += w; return; }
            if (e[0] >= hi) { if (holes) Offset -= w; return; }
            Weights.Add(holes ? -w : w);
            for (int i = 0; i < 4; i++) Energies.Add(e[i]);
        }

        // Count below E minus N (integer filling) or count below E.
        public double Count(double energy)
        {
            double s = Offset;
            var e = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(Energies);
            for (int t = 0; t < Weights.Count; t++)
            {
                double w = Weights[t], f = SimplexKernel.TetraFraction(e.Slice(4 * t, 4), energy);
                s += w > 0 ? w * f : w * (1 - f);
            }
            return s;
        }

        public double Density(double energy)
        {
            double s = 0;
            var e = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(Energies);
            for (int t = 0; t < Weights.Count; t++) s += Math.Abs(Weights[t]) * SimplexKernel.TetraDensity(e.Slice(4 * t, 4), energy).D;
            return s;
        }
    }

    private long StraddlingCount(double lo, double hi)
    {
        long count = 0;
        var gate = new object();
        Sweep(() => new long[1], (c, e, _, _) => { if (e[3] > lo && e[0] < hi) c[0]++; }, c => { lock (gate) count += c[0]; });
        return count;
    }

    private StraddleList Straddling(double lo, double hi, int occupied)
    {
        var list = new StraddleList(occupied);
        var gate = new object();
        Sweep(() => new StraddleList(occupied), (s, e, w, band) => s.Add(e, w, band, lo, hi), s =>
        {
            lock (gate) { list.Offset += s.Offset; list.Weights.AddRange(s.Weights); list.Energies.AddRange(s.Energies); }
        });
        return list;
    }

    // Thread-local DOS accumulation on an ascending grid. Per tetrahedron the linear-tetrahedron formulas
    // (Lehmann & Taut 1972; Bloechl et al. 1994, App. B; as in SimplexKernel) are evaluated with the corner
    // differences computed once.
    private sealed class Accumulate(double[] grid)
    {
        public readonly double[] Total = new double[grid.Length], Partial = new double[grid.Length], Steps = new double[grid.Length + 1];

        public void Add(double[] e, double w)
        {
            // First grid energy above the top corner: everything from there on holds the tetrahedron's states.
            int top = UpperBound(grid, e[3]);
            Steps[top] += w;
            int i = UpperBound(grid, e[0]);
            if (i >= top) return;
            double e21 = e[1] - e[0], e31 = e[2] - e[0], e41 = e[3] - e[0], e32 = e[2] - e[1], e42 = e[3] - e[1], e43 = e[3] - e[2];
            double c1 = w / (e21 * e31 * e41), c3 = w / (e41 * e42 * e43);
            double c2 = w / (e31 * e41), a2 = (e31 + e42) / (e32 * e42);
            for (; i < top; i++)
            {
                double E = grid[i];
                if (E < e[1])
                {
                    double x = E - e[0];
                    Partial[i] += c1 * x * x * x; Total[i] += 3 * c1 * x * x;
                }
                else if (E < e[2])
                {
                    double y = E - e[1];
                    Partial[i] += c2 * (e21 * e21 + 3 * e21 * y + 3 * y * y - a2 * y * y * y);
                    Total[i] += c2 * (3 * e21 + 6 * y - 3 * a2 * y * y);
                }
                else
                {
                    double z = e[3] - E;
                    if (z <= 0) { Partial[i] += w; continue; }
                    Partial[i] += w - c3 * z * z * z; Total[i] += 3 * c3 * z * z;
                }
            }
        }

        // Index of the first grid energy strictly above x (grid.Length when none).
        private static int UpperBound(double[] g, double x)
        {
            int lo = 0, hi = g.Length;
            while (lo < hi) { int mid = (lo + hi) >> 1; if (g[mid] > x) hi = mid; else lo = mid + 1; }
            return lo;
        }
    }

    // Calls add(sorted corner energies, weight) for every (tetrahedron, band): the base mesh for bands not refined,
    // the leaves for the refined ones. Parallel over cells with one state per thread, merged by finish.
    private void Sweep<T>(Func<T> local, Action<T, double[], double, int> add, Action<T> finish)
    {
        int bands = Bands, first = _first, active = _active;
        var baseE = _base.Energies;
        var corners = _baseSimplices.Corners;
        double baseWeight = 1.0 / _baseSimplices.Count;
        if (active < bands)
            Parallel.For(0, _baseSimplices.Count, () => (State: local(), E: new double[4]), (s, _, loc) =>
            {
                for (int n = 0; n < bands; n++)
                {
                    if (n >= first && n < first + active) continue;
                    for (int c = 0; c < 4; c++) loc.E[c] = baseE[corners[4 * s + c] * bands + n];
                    Sort4(loc.E);
                    if (loc.E[3] > loc.E[0]) add(loc.State, loc.E, baseWeight, n);
                    else Degenerate(loc.State, loc.E, baseWeight, n, add);
                }
                return loc;
            }, loc => finish(loc.State));
        if (active == 0) return;
        var leafCorners = _leafCorners;
        var leafLevel = _leafLevel;
        var energy = _energy;
        double cellWeight = 1.0 / ((double)_n0 * _n0 * _n0 * 6);
        int start = _start;
        var leafCentre = _leafCentre;
        Parallel.For(0, Leaves, () => (State: local(), E: new double[4]), (leaf, _, loc) =>
        {
            double w = cellWeight * Math.ScaleB(1.0, -3 * leafLevel[leaf]);
            int b = 8 * leaf, centre = leafCentre[leaf];
            if (centre >= 0)
            {
                // Twelve tetrahedra around the centre, which the refinement test diagonalised anyway: half the
                // longest edge of the six-tetrahedron split, so a smaller interpolation error for no extra k-point.
                double w12 = w * 0.5;
                foreach (var tri in FaceTriangles)
                {
                    int k1 = leafCorners[b + tri[0]], k2 = leafCorners[b + tri[1]], k3 = leafCorners[b + tri[2]];
                    for (int a = 0; a < active; a++)
                    {
                        loc.E[0] = energy[centre * active + a]; loc.E[1] = energy[k1 * active + a];
                        loc.E[2] = energy[k2 * active + a]; loc.E[3] = energy[k3 * active + a];
                        Sort4(loc.E);
                        if (loc.E[3] > loc.E[0]) add(loc.State, loc.E, w12, first + a);
                        else Degenerate(loc.State, loc.E, w12, first + a, add);
                    }
                }
                return loc;
            }
            foreach (var path in KuhnPaths)
            {
                int c1 = start ^ path[0], c2 = c1 ^ path[1], c3 = c2 ^ path[2];
                int k0 = leafCorners[b + start], k1 = leafCorners[b + c1], k2 = leafCorners[b + c2], k3 = leafCorners[b + c3];
                for (int a = 0; a < active; a++)
                {
                    loc.E[0] = energy[k0 * active + a]; loc.E[1] = energy[k1 * active + a];
                    loc.E[2] = energy[k2 * active + a]; loc.E[3] = energy[k3 * active + a];
                    Sort4(loc.E);
                    if (loc.E[3] > loc.E[0]) add(loc.State, loc.E, w, first + a);
                    else Degenerate(loc.State, loc.E, w, first + a, add);
                }
            }
            return loc;
        }, loc => finish(loc.State));
    }

    // A flat tetrahedron (all corners equal) is a step in the count: spread it over a relative 1e-12 so that the
    // formulas stay finite, as a delta function would be on any grid coarser than that.
    private static void Degenerate<T>(T state, double[] e, double w, int band, Action<T, double[], double, int> add)
    {
        double h = 1e-12 * Math.Max(1, Math.Abs(e[0]));
        e[0] -= 1.5 * h; e[1] -= 0.5 * h; e[2] += 0.5 * h; e[3] += 1.5 * h;
        add(state, e, w, band);
    }

    private static void Sort4(double[] e)
    {
        for (int i = 1; i < 4; i++)
        {
            double v = e[i]; int j = i - 1;
            while (j >= 0 && e[j] > v) { e[j + 1] = e[j]; j--; }
            e[j + 1] = v;
        }
    }
}
