using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Symmetry;

/// <summary>
/// Tests every lattice operation, with and without time reversal, against a Bloch Hamiltonian: an operation is kept when
/// some U made of a site permutation and a flavour rotation satisfies H(Sk) = U H(k)^(*) U^dag at random k for the fixed
/// and the scaled (boson-dressed) parts separately, so it holds for every (r, lambda) of the mean field.
/// </summary>
internal sealed class SymmetryFinder
{
    /// <summary>An operation is kept when its defect is below this fraction of the model's largest amplitude.</summary>
    public const double RelativeTolerance = 1e-10;
    private const int Samples = 3;
    private const int Seed = 20261;

    private readonly BlochHamiltonian _bare;
    private readonly BoundModel _model;
    private readonly int _n, _f;
    private readonly double _scale;
    private readonly Vec3[] _k;
    private readonly Complex[][] _fixed, _scaled;

    public SymmetryFinder(BlochHamiltonian bare)
    {
        _bare = bare; _model = bare.Model; _n = bare.Size; _f = _model.Flavours;
        _scale = LargestAmplitude(_model);
        var rng = new Random(Seed);
        var lattice = _model.Lattice;
        _k = new Vec3[Samples]; _fixed = new Complex[Samples][]; _scaled = new Complex[Samples][];
        for (int s = 0; s < Samples; s++)
        {
            _k[s] = lattice.Cartesian(rng.NextDouble() - 0.5, rng.NextDouble() - 0.5, lattice.Dimension >= 3 ? rng.NextDouble() - 0.5 : 0);
            (_fixed[s], _scaled[s]) = Parts(_k[s]);
        }
    }

    /// <summary>Largest |amplitude| of any bond, on-site term or shell level (energy unit); the scale defects are judged on.</summary>
    public static double LargestAmplitude(BoundModel model)
    {
        double m = 0;
        foreach (var h in model.Hoppings) m = Math.Max(m, h.Amplitude.MaxAbs());
        foreach (var o in model.Onsite) m = Math.Max(m, o.Amplitude.MaxAbs());
        foreach (var s in model.Shells) m = Math.Max(m, Math.Abs(s.Level));
        return m > 0 ? m : 1.0;
    }

    private (Complex[] Fixed, Complex[] Scaled) Parts(Vec3 k)
    {
        var f = new Complex[_n * _n]; var s = new Complex[_n * _n];
        _bare.AssembleParts(k, f, s);
        for (int i = 0; i < _n; i++) f[i * _n + i] += _bare.Levels[i];
        return (f, s);
    }

    /// <summary>Every candidate's verdict, and the kept operations (not yet closed under products).</summary>
    public (List<OperationCheck> Checks, List<SymmetryOperation> Kept) Run(IReadOnlyList<PointOperation> points)
    {
        var checks = new List<OperationCheck>();
        var kept = new List<SymmetryOperation>();
        foreach (var p in points)
            foreach (bool tr in new[] { false, true })
            {
                var (op, check) = Test(p, tr);
                checks.Add(check);
                if (op is not null) kept.Add(op);
            }
        return (checks, kept);
    }

    private (SymmetryOperation?, OperationCheck) Test(PointOperation p, bool timeReversal)
    {
        string name = new SymmetryOperation(p, timeReversal, []).Name;
        double best = double.PositiveInfinity;
        string reason = "";
        bool anyPermutation = false;
        foreach (var (map, problem) in OrbitalMaps(p))
        {
            // Prefer the most telling reason: a group swapped or a missing orbital over a site landing nowhere.
            if (map is null) { if (reason.Length == 0 || !problem.EndsWith("no site", StringComparison.Ordinal)) reason = problem; continue; }
            anyPermutation = true;
            foreach (var flavour in FlavourCandidates(p, timeReversal))
            {
                var u = Build(map, flavour);
                var (defect, where) = Defect(p, timeReversal, u, stopAbove: RelativeTolerance);
                if (defect < best) { best = defect; reason = where; }
                if (defect <= RelativeTolerance)
                    return (new SymmetryOperation(p, timeReversal, u), new OperationCheck(name, true, defect, ""));
            }
        }
        if (!anyPermutation) return (null, new OperationCheck(name, false, double.PositiveInfinity, reason));
        return (null, new OperationCheck(name, false, best, reason));
    }

    /// <summary>
    /// Orbital permutations induced by R with every translation that maps site 0 onto a site; null with a reason when a
    /// site lands off the sites, on a site with other orbitals, or on a shell of another group.
    /// </summary>
    private IEnumerable<(int[]? Map, string Problem)> OrbitalMaps(PointOperation p)
    {
        var sites = _model.Sites;
        var lattice = _model.Lattice;
        var origin = p.Apply(sites[0].Position);
        for (int target = 0; target < sites.Count; target++)
        {
            var t = sites[target].Position - origin;
            var siteMap = new int[sites.Count];
            string problem = "";
            for (int i = 0; i < sites.Count && problem.Length == 0; i++)
            {
                var image = p.Apply(sites[i].Position) + t;
                siteMap[i] = -1;
                for (int j = 0; j < sites.Count; j++)
                    if (lattice.LatticeCoordinates(sites[j].Position - image) is not null) { siteMap[i] = j; break; }
                if (siteMap[i] < 0) problem = $"site {sites[i].Name} maps to {image}, which is no site";
            }
            if (problem.Length > 0) { yield return (null, problem); continue; }
            yield return OrbitalMap(siteMap);
        }
    }

    private (int[]?, string) OrbitalMap(int[] siteMap)
    {
        var orbitals = _model.Orbitals;
        var map = new int[orbitals.Count];
        var group = new string?[orbitals.Count];
        foreach (var s in _model.Shells) group[s.Orbital] = s.Group;
        for (int o = 0; o < orbitals.Count; o++)
        {
            var source = orbitals[o];
            int to = siteMap[source.Site];
            map[o] = -1;
            for (int q = 0; q < orbitals.Count; q++)
                if (orbitals[q].Site == to && orbitals[q].Name == source.Name && orbitals[q].Kind == source.Kind) { map[o] = q; break; }
            if (map[o] < 0)
                return (null, $"site {_model.Sites[source.Site].Name} maps onto site {_model.Sites[to].Name}, which has no orbital {source.Name}");
            if (group[o] != group[map[o]])
                return (null, $"it maps shell group {group[o]} onto {group[map[o]]} (only operations that keep every group are used)");
        }
        return (map, "");
    }

    /// <summary>
    /// Flavour matrices to try: for spin-1/2 the spin rotation of the proper part of R (both senses) and the identity
    /// (models without spin-orbit coupling rotate space and spin separately); time reversal adds i sigma_y or plain
    /// complex conjugation. Other flavour counts try the identity only.
    /// </summary>
    private IEnumerable<Complex[]> FlavourCandidates(PointOperation p, bool timeReversal)
    {
        var list = new List<Complex[]>();
        if (_f == 2)
        {
            var (angle, axis) = PointOperation.AxisAngle(p.Rotation, p.Determinant, p.Trace);
            double c = Math.Cos(angle / 2), s = Math.Sin(angle / 2);
            var i = Complex.ImaginaryOne;
            // D = cos(theta/2) 1 - i sin(theta/2) n.sigma
            Complex[] d = [c - i * s * axis.Z, -i * s * (axis.X - i * axis.Y), -i * s * (axis.X + i * axis.Y), c + i * s * axis.Z];
            Complex[] dagger = [Complex.Conjugate(d[0]), Complex.Conjugate(d[2]), Complex.Conjugate(d[1]), Complex.Conjugate(d[3])];
            Complex[] one = [1, 0, 0, 1];
            foreach (var rot in new[] { d, dagger, one })
            {
                if (!timeReversal) { list.Add(rot); continue; }
                // i sigma_y = [[0, 1], [-1, 0]]: rot * i sigma_y, and plain conjugation (rot alone).
                list.Add([-rot[1], rot[0], -rot[3], rot[2]]);
                list.Add(rot);
            }
        }
        else
        {
            var one = new Complex[_f * _f];
            for (int a = 0; a < _f; a++) one[a * _f + a] = 1;
            list.Add(one);
        }
        return list;
    }

    private Complex[] Build(int[] orbitalMap, Complex[] flavour)
    {
        var u = new Complex[_n * _n];
        for (int o = 0; o < orbitalMap.Length; o++)
            for (int a = 0; a < _f; a++)
                for (int b = 0; b < _f; b++)
                    u[(orbitalMap[o] * _f + a) * _n + o * _f + b] = flavour[a * _f + b];
        return u;
    }

    /// <summary>
    /// Largest deviation relative to the model's scale, and where it sits (basis pair and part); once it exceeds
    /// <paramref name="stopAbove"/> the remaining samples are skipped (the value is then a lower bound).
    /// </summary>
    internal (double Defect, string Where) Defect(PointOperation p, bool timeReversal, Complex[] u, double stopAbove = double.PositiveInfinity)
    {
        double worst = 0; string where = "";
        var t1 = new Complex[_n * _n]; var t2 = new Complex[_n * _n];
        for (int s = 0; s < Samples && worst <= stopAbove; s++)
        {
            var k = p.Apply(_k[s]);
            if (timeReversal) k = -k;
            var (f, sc) = Parts(k);
            for (int part = 0; part < 2; part++)
            {
                var h = part == 0 ? _fixed[s] : _scaled[s];
                var target = part == 0 ? f : sc;
                Transform(u, h, timeReversal, t1, t2);
                for (int i = 0; i < _n * _n; i++)
                {
                    double d = Complex.Abs(target[i] - t2[i]) / _scale;
                    if (d > worst)
                    {
                        worst = d;
                        where = $"H({Label(i / _n)}, {Label(i % _n)}) {(part == 0 ? "of the fixed part" : "of the hybridization part")} " +
                                $"differs by {d:G3} of the largest amplitude ({d * _scale:G4} {_model.Unit.Symbol()})";
                    }
                }
            }
        }
        return (worst, where);
    }

    /// <summary>result = U h^(*) U^dag; scratch holds U h^(*).</summary>
    private void Transform(Complex[] u, Complex[] h, bool conjugate, Complex[] scratch, Complex[] result)
    {
        int n = _n;
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
            {
                Complex s = 0;
                for (int l = 0; l < n; l++)
                {
                    var ul = u[i * n + l];
                    if (ul == Complex.Zero) continue;
                    s += ul * (conjugate ? Complex.Conjugate(h[l * n + j]) : h[l * n + j]);
                }
                scratch[i * n + j] = s;
            }
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
            {
                Complex s = 0;
                for (int l = 0; l < n; l++)
                {
                    var ul = u[j * n + l];
                    if (ul == Complex.Zero) continue;
                    s += scratch[i * n + l] * Complex.Conjugate(ul);
                }
                result[i * n + j] = s;
            }
    }

    private string Label(int basis)
    {
        var o = _model.Orbitals[basis / _f];
        string flavour = _f == 2 ? (basis % 2 == 0 ? " up" : " down") : _f == 1 ? "" : $" {basis % _f}";
        return o.Label(_model.Sites) + flavour;
    }

    /// <summary>The product a * b as an operation: U = U_a U_b^(*) (conjugated when a is antiunitary).</summary>
    public static SymmetryOperation Compose(SymmetryOperation a, SymmetryOperation b, PointOperation product)
    {
        int n = (int)Math.Round(Math.Sqrt(a.Unitary.Length));
        var u = new Complex[n * n];
        for (int i = 0; i < n; i++)
            for (int j = 0; j < n; j++)
            {
                Complex s = 0;
                for (int l = 0; l < n; l++)
                {
                    var bl = b.Unitary[l * n + j];
                    s += a.Unitary[i * n + l] * (a.TimeReversal ? Complex.Conjugate(bl) : bl);
                }
                u[i * n + j] = s;
            }
        return new SymmetryOperation(product, a.TimeReversal ^ b.TimeReversal, u);
    }
}
