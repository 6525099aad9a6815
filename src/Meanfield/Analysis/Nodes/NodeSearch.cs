using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Nodes;

/// <summary>
/// Finds every touching of bands n_occ - 1 and n_occ (0-based): the gap on a Gamma-centred coarse mesh, its local
/// minima, Nelder-Mead refinement of each to a gap below GapTolerance x bandwidth, deduplication modulo reciprocal
/// lattice vectors, then per node the chirality (link variables on a sphere), the cone fit, degeneracy and location.
/// </summary>
public static class NodeSearch
{
    public static NodeSearchResult Find(IBlochSource source, int occupied, double chemicalPotential, NodeSearchOptions? options = null)
    {
        var opt = options ?? new NodeSearchOptions();
        var lattice = source.Model.Lattice;
        int dim = lattice.Dimension;
        if (dim < 2) throw new ArgumentException("Node search needs a lattice with momentum.");
        if (occupied < 1 || occupied >= source.Size)
            throw new ArgumentOutOfRangeException(nameof(occupied), $"occupied band count {occupied} must lie in 1..{source.Size - 1}");
        var mesh = new KMesh(lattice, opt.Mesh);
        var sp = MeshSpectrum.Compute(source, mesh, withProjections: false);
        var (lo, hi) = sp.Range();
        double width = Math.Max(hi - lo, 1e-300), target = opt.GapTolerance * width;

        double valMax = double.NegativeInfinity, condMin = double.PositiveInfinity;
        var gap = new double[mesh.Count];
        for (int k = 0; k < mesh.Count; k++)
        {
            double v = sp.Energy(k, occupied - 1), c = sp.Energy(k, occupied);
            gap[k] = c - v; valMax = Math.Max(valMax, v); condMin = Math.Min(condMin, c);
        }
        double metalTol = 1e-6 * width, overlap = valMax - condMin;
        bool metal = overlap > metalTol || valMax > chemicalPotential + metalTol || condMin < chemicalPotential - metalTol;

        var warnings = new List<string>();
        var candidates = LocalMinima(mesh, gap, dim);
        if (candidates.Count > opt.MaxCandidates)
        {
            warnings.Add($"{candidates.Count} local gap minima on the coarse mesh; refined only the {opt.MaxCandidates} lowest.");
            candidates = candidates.GetRange(0, opt.MaxCandidates);
        }

        var refined = new (double[] U, double Gap)[candidates.Count];
        Parallel.For(0, candidates.Count, () => new BlochWorkspace(source), (c, _, ws) =>
        {
            var u0 = mesh.Reduced(candidates[c]);
            double F(double[] u) => ws.Gap(lattice.Cartesian(u[0], u[1], dim == 3 ? u[2] : 0), occupied - 1);
            double[] x0 = dim == 3 ? [u0.X, u0.Y, u0.Z] : [u0.X, u0.Y];
            var best = NelderMead.Minimise(F, x0, 0.5 / opt.Mesh, target, 1e-14, 3000);
            if (best.F >= target) best = NelderMead.Minimise(F, best.X, 1e-3 / opt.Mesh, target, 1e-15, 3000);
            refined[c] = (best.X, best.F);
            return ws;
        }, _ => { });

        var distinct = Deduplicate(refined, target, dim);
        var nodes = Characterise(source, distinct, occupied, chemicalPotential, width, opt);
        int sum = nodes.Sum(n => n.Chirality);

        double spacing = Math.Max(lattice.B1.Norm, Math.Max(lattice.B2.Norm, dim == 3 ? lattice.B3.Norm : 0)) / opt.Mesh;
        double closest = ClosestPair(lattice, nodes);
        if (closest < 2 * spacing)
            warnings.Add($"mesh too coarse to resolve nodes closer than {2 * spacing:G3} 1/angstrom (closest pair {closest:G3}); try --mesh {2 * opt.Mesh}.");
        if (dim == 3 && sum != 0)
            warnings.Add($"chiralities sum to {sum}, not zero: some nodes were missed or merged; try --mesh {2 * opt.Mesh}.");
        bool line = nodes.Count > opt.NodalLineCount
                    || nodes.Any(n => n.VelocitySingular[^1] < 1e-3 * n.VelocitySingular[0]);
        if (line) warnings.Add("touching points form a line (nodal line) or a cone has a flat direction.");
        if (metal)
            warnings.Add($"metal: bands {occupied - 1} and {occupied} are not separated at the chemical potential "
                         + $"(overlap {overlap:G4}, highest occupied-band energy {valMax:G6}, lowest empty-band energy {condMin:G6}).");
        return new NodeSearchResult(nodes, sum, metal, overlap, line, warnings, occupied, chemicalPotential, mesh.ToString());
    }

    private static List<int> LocalMinima(KMesh mesh, double[] gap, int dim)
    {
        var list = new List<int>();
        int r3 = dim == 3 ? 1 : 0;
        for (int i1 = 0; i1 < mesh.N1; i1++)
            for (int i2 = 0; i2 < mesh.N2; i2++)
                for (int i3 = 0; i3 < mesh.N3; i3++)
                {
                    int k = mesh.Index(i1, i2, i3);
                    bool min = true;
                    for (int a = -1; a <= 1 && min; a++)
                        for (int b = -1; b <= 1 && min; b++)
                            for (int c = -r3; c <= r3 && min; c++)
                                if (Math.Abs(a) + Math.Abs(b) + Math.Abs(c) == 1 && gap[mesh.Index(i1 + a, i2 + b, i3 + c)] < gap[k]) min = false;
                    if (min) list.Add(k);
                }
        list.Sort((x, y) => gap[x].CompareTo(gap[y]));
        return list;
    }

    private static List<double[]> Deduplicate((double[] U, double Gap)[] refined, double target, int dim)
    {
        var kept = new List<double[]>();
        foreach (var (u, g) in refined.Where(r => r.Gap < target).OrderBy(r => r.Gap))
        {
            // Fold into [0, 1), snapping values within rounding of 1 back to 0.
            var folded = u.Select(x => { double f = x - Math.Floor(x); return f > 1 - 1e-9 ? 0 : f; }).ToArray();
            bool seen = kept.Any(p => Enumerable.Range(0, dim).All(i =>
            {
                double d = Math.Abs(p[i] - folded[i]);
                return Math.Min(d, 1 - d) < 1e-6;
            }));
            if (!seen) kept.Add(folded);
        }
        return kept;
    }

    private static List<WeylNode> Characterise(IBlochSource source, List<double[]> positions, int occupied, double mu,
                                               double width, NodeSearchOptions opt)
    {
        var lattice = source.Model.Lattice;
        int dim = lattice.Dimension;
        var ks = positions.Select(u => NearestImage(lattice, lattice.Cartesian(u[0], u[1], dim == 3 ? u[2] : 0))).ToList();
        double bMin = Math.Min(lattice.B1.Norm, Math.Min(lattice.B2.Norm, dim == 3 ? lattice.B3.Norm : double.PositiveInfinity));
        var ws = new BlochWorkspace(source);
        var nodes = new List<WeylNode>();
        for (int i = 0; i < ks.Count; i++)
        {
            var k = ks[i];
            ws.Solve(k, false);
            double ev = ws.Values[occupied - 1], ec = ws.Values[occupied], mid = 0.5 * (ev + ec);
            int deg = 0;
            for (int n = 0; n < ws.Size; n++) if (Math.Abs(ws.Values[n] - mid) < opt.DegeneracyTolerance * width) deg++;
            var cone = ConeFit.Compute(ws, k, occupied - 1, 1e-5 * bMin, dim);
            int chirality = 0; double flux = double.NaN;
            if (dim == 3)
            {
                double nearest = double.PositiveInfinity;
                for (int j = 0; j < ks.Count; j++) if (j != i) nearest = Math.Min(nearest, PeriodicDistance(lattice, k, ks[j]));
                double radius = Math.Min(0.02 * bMin, 0.3 * nearest);
                for (int attempt = 0; attempt < 4; attempt++, radius /= 4)
                {
                    var s = SphereChirality.Compute(source, k, radius, occupied, opt.SphereTheta, opt.SpherePhi);
                    if (s.MinimumGap > 1e-6 * width) { flux = s.FluxOver2Pi; chirality = s.Chirality; break; }
                }
            }
            var u = positions[i];
            nodes.Add(new WeylNode(k, new Vec3(u[0], u[1], dim == 3 ? u[2] : 0), mid - mu, ec - ev, chirality, flux,
                cone.Velocity, cone.Singular, cone.DetVelocity, cone.Tilt, cone.TiltRatio, deg,
                HighSymmetryLocator.Locate(lattice, k, 1e-5)));
        }
        return nodes;
    }

    // The image k + G closest to Gamma, so that reported Cartesian positions read naturally.
    private static Vec3 NearestImage(Lattice lattice, Vec3 k)
    {
        var best = k;
        int r3 = lattice.Dimension == 3 ? 1 : 0;
        for (int a = -1; a <= 1; a++)
            for (int b = -1; b <= 1; b++)
                for (int c = -r3; c <= r3; c++)
                {
                    var q = k + lattice.Cartesian(a, b, c);
                    if (q.Norm < best.Norm - 1e-12) best = q;
                }
        return best;
    }

    /// <summary>Shortest distance between k1 and the images k2 + G (inverse angstrom).</summary>
    public static double PeriodicDistance(Lattice lattice, Vec3 k1, Vec3 k2)
    {
        double best = double.PositiveInfinity;
        int r3 = lattice.Dimension == 3 ? 1 : 0;
        for (int a = -1; a <= 1; a++)
            for (int b = -1; b <= 1; b++)
                for (int c = -r3; c <= r3; c++)
                    best = Math.Min(best, (k1 - k2 - lattice.Cartesian(a, b, c)).Norm);
        return best;
    }

    private static double ClosestPair(Lattice lattice, List<WeylNode> nodes)
    {
        double best = double.PositiveInfinity;
        for (int i = 0; i < nodes.Count; i++)
            for (int j = i + 1; j < nodes.Count; j++)
                best = Math.Min(best, PeriodicDistance(lattice, nodes[i].Cartesian, nodes[j].Cartesian));
        return best;
    }
}
