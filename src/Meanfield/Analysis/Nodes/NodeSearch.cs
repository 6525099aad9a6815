using Meanfield.Analysis.Dos;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Solver;
using Meanfield.Symmetry;

namespace Meanfield.Analysis.Nodes;

/// <summary>
/// Finds every touching of bands n_occ - 1 and n_occ (0-based), counted from the electron number whatever mu does:
/// the gap on a Gamma-centred coarse mesh, its local minima, Gauss-Newton refinement of each (<see cref="NodeRefiner"/>)
/// to a gap below <see cref="SpectrumTolerances.NodeGap"/>, merging by Cartesian distance modulo reciprocal vectors,
/// completion of every node's orbit under the lattice's point operations (an image is kept only where the bands
/// really touch), then per node the cone fit, the degeneracy, the chirality from a converged flux and the location.
/// Every tolerance is relative to the width of the two bands and to |b|_min (<see cref="SpectrumTolerances"/>).
/// Given a pass of the same Hamiltonian over a mesh at least as fine as the coarse one (a solve's final pass, see
/// <see cref="ZonePass"/>), its eigenvalues are the coarse scan and its symmetry group is used: one minimum per orbit is
/// refined, orbits are completed with the group's operations only, and the chirality is computed once per orbit and
/// carried to the images by the operation's parity.
/// </summary>
public static class NodeSearch
{
    /// <summary>Finite-difference step of the cone fit as a fraction of |b|_min.</summary>
    public const double ConeStepFraction = 1e-5;
    /// <summary>A cone whose smallest velocity is below this fraction of its largest has a flat direction (a line).</summary>
    public const double FlatConeFraction = 1e-3;
    /// <summary>Coarse minima whose Gauss-Newton start fails get a Nelder-Mead pre-search down to this fraction of the pair width.</summary>
    public const double PreSearchFraction = 1e-4;

    /// <summary>
    /// The touchings of bands <paramref name="occupied"/> - 1 and <paramref name="occupied"/> of
    /// <paramref name="source"/>, with offsets from <paramref name="chemicalPotential"/> (energy unit).
    /// </summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Size-1.</exception>
    public static NodeSearchResult Find(IBlochSource source, int occupied, double chemicalPotential, NodeSearchOptions? options = null) =>
        Find(source, occupied, chemicalPotential, options, null);

    /// <summary>
    /// As <see cref="Find(IBlochSource, int, double, NodeSearchOptions?)"/>, seeded from <paramref name="pass"/> (a pass of
    /// <paramref name="source"/> itself, such as a solve's final one) instead of a fresh coarse mesh when its mesh has at
    /// least <see cref="NodeSearchOptions.Mesh"/> divisions along every axis: its gaps are the coarse scan, on that finer mesh.
    /// </summary>
    /// <exception cref="ArgumentException">A lattice without momentum.</exception>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="occupied"/> outside 1..Size-1.</exception>
    public static NodeSearchResult Find(IBlochSource source, int occupied, double chemicalPotential, NodeSearchOptions? options, ZonePass? pass)
    {
        var opt = options ?? new NodeSearchOptions();
        var lattice = source.Model.Lattice;
        int dim = lattice.Dimension;
        if (dim < 2) throw new ArgumentException("Node search needs a lattice with momentum.");
        if (occupied < 1 || occupied >= source.Size)
            throw new ArgumentOutOfRangeException(nameof(occupied), $"occupied band count {occupied} must lie in 1..{source.Size - 1}");
        if (opt.Mesh < 4) throw new ArgumentOutOfRangeException(nameof(options), $"the coarse mesh needs at least 4 divisions, got {opt.Mesh}");
        if (pass is not null && !FineEnough(pass.Wedge.Mesh, opt.Mesh, dim)) pass = null;
        var (mesh, energies, rowOf) = pass is not null
            ? (pass.Wedge.Mesh, pass.Energies, pass.RowOfPoint)
            : CoarsePass(source, new KMesh(lattice, opt.Mesh));
        int bands = source.Size, rows = energies.Length / bands;
        double valMax = double.NegativeInfinity, condMin = double.PositiveInfinity, pairLow = double.PositiveInfinity,
               pairHigh = double.NegativeInfinity, largest = 0;
        for (int w = 0; w < rows; w++)
        {
            double v = energies[w * bands + occupied - 1], c = energies[w * bands + occupied];
            valMax = Math.Max(valMax, v); condMin = Math.Min(condMin, c);
            pairLow = Math.Min(pairLow, v); pairHigh = Math.Max(pairHigh, c);
            largest = Math.Max(largest, Math.Max(Math.Abs(energies[w * bands]), Math.Abs(energies[w * bands + bands - 1])));
        }
        var gap = new double[mesh.Count];
        for (int k = 0; k < mesh.Count; k++)
        {
            int w = rowOf is null ? k : rowOf[k];
            gap[k] = energies[w * bands + occupied] - energies[w * bands + occupied - 1];
        }
        var tol = SpectrumTolerances.For(pairLow, pairHigh, largest, source.Size, lattice, opt.Temperature);

        var warnings = new List<string>();
        // A band pair degenerate across the zone (a Kramers pair of an inversion- and time-reversal-symmetric spectrum
        // cut by the electron count) touches everywhere: a partly filled band, not nodes.
        int degenerate = 0;
        foreach (var g in gap) if (g < tol.Degeneracy) degenerate++;
        if (degenerate > mesh.Count / 2)
        {
            warnings.Add($"bands {occupied - 1} and {occupied} are degenerate across the zone: the electron count fills a degenerate pair partly (a Fermi surface).");
            return new NodeSearchResult([], null, valMax - condMin, 0, true, false, 0, warnings, occupied, chemicalPotential,
                                        mesh.ToString(), tol, dim);
        }
        var candidates = LocalMinima(mesh, gap, dim);
        // Minima in one orbit of the pass's symmetry are images of each other: the lowest is refined, and the orbit
        // completion below adds the images of the node it finds.
        if (rowOf is not null && opt.CompleteOrbits) candidates = OnePerOrbit(candidates, rowOf);

        if (candidates.Count > opt.MaxCandidates)
        {
            warnings.Add($"{candidates.Count} local gap minima on the coarse mesh; refined only the {opt.MaxCandidates} lowest.");
            candidates = candidates.GetRange(0, opt.MaxCandidates);
        }

        var refined = new RefinedPoint[candidates.Count];
        Parallel.For(0, candidates.Count, () => new NodeRefiner(source, tol.ReciprocalLength), (c, _, refiner) =>
        {
            refined[c] = RefineFrom(refiner, lattice, mesh.Cartesian(candidates[c]), occupied - 1, tol, opt.Mesh);
            return refiner;
        }, _ => { });

        var found = new List<Vec3>();
        int unresolved = 0;
        foreach (var p in refined.OrderBy(p => p.Gap))
        {
            if (p.Converged) AddDistinct(found, lattice, p.K, tol.Merge);
            else if (p.Gap < tol.Gap) unresolved++;
        }
        if (opt.CompleteOrbits) CompleteOrbits(source, lattice, found, occupied - 1, tol, 4 * opt.NodalLineCount, pass?.Wedge.Group);

        var nodes = Characterise(source, found, occupied, chemicalPotential, tol, pass?.Wedge.Group);
        bool resolved = dim != 3 || nodes.All(n => n.Chirality is not null);
        int? sum = dim == 3 && resolved ? nodes.Sum(n => n.Chirality!.Value) : null;

        double spread = 0;
        if (nodes.Count > 0)
        {
            double lo = nodes.Min(n => n.Energy), hi = nodes.Max(n => n.Energy);
            spread = hi - lo;
            valMax = Math.Max(valMax, hi); condMin = Math.Min(condMin, lo);
        }
        double overlap = valMax - condMin;
        bool fermiSurface = overlap > spread + tol.Overlap;

        double spacing = Math.Max(lattice.B1.Norm, Math.Max(lattice.B2.Norm, dim == 3 ? lattice.B3.Norm : 0)) / opt.Mesh;
        double closest = ClosestPair(lattice, nodes);
        if (closest < spacing)
            warnings.Add($"nodes closer than one coarse-mesh spacing ({closest:G3} against {spacing:G3} 1/angstrom): a pair may have been missed; try a search mesh of {2 * opt.Mesh}.");
        int undetermined = nodes.Count(n => dim == 3 && n.Chirality is null);
        if (undetermined > 0)
            warnings.Add($"the chirality of {undetermined} node(s) is undetermined: no sphere gave an integer Berry flux; try a finer search mesh.");
        if (sum is { } s && s != 0)
            warnings.Add($"chiralities sum to {s}, not zero: some nodes were missed; try a search mesh of {2 * opt.Mesh}.");
        if (unresolved > 0)
            warnings.Add($"{unresolved} coarse gap minima fell below {tol.Gap:G3} but did not refine to a touching; try a finer search mesh.");
        bool line = nodes.Count > opt.NodalLineCount
                    || nodes.Any(n => n.VelocitySingular[dim - 1] < FlatConeFraction * n.VelocitySingular[0]);
        if (line) warnings.Add("touching points form a line (nodal line) or a cone has a flat direction.");
        if (fermiSurface)
            warnings.Add($"bands {occupied - 1} and {occupied} overlap by {overlap:G4} beyond the spread {spread:G4} of the node energies: a Fermi surface away from the nodes.");
        return new NodeSearchResult(nodes, sum, overlap, spread, fermiSurface, line, unresolved, warnings, occupied,
                                    chemicalPotential, mesh.ToString(), tol, dim);
    }

    // The coarse scan on a fresh Gamma-centred mesh: energies of every point, in mesh order.
    private static (KMesh Mesh, double[] Energies, int[]? RowOf) CoarsePass(IBlochSource source, KMesh mesh) =>
        (mesh, MeshSpectrum.Compute(source, mesh, withProjections: false).Energies, null);

    private static List<int> OnePerOrbit(List<int> candidates, int[] rowOf)
    {
        var seen = new HashSet<int>();
        var kept = new List<int>(candidates.Count);
        foreach (int k in candidates) if (seen.Add(rowOf[k])) kept.Add(k);
        return kept;
    }

    private static bool FineEnough(KMesh mesh, int divisions, int dim) =>
        mesh.N1 >= divisions && mesh.N2 >= divisions && (dim < 3 || mesh.N3 >= divisions);

    // Gauss-Newton from a coarse minimum; when it cannot start, a Nelder-Mead pre-search brings it closer first.
    private static RefinedPoint RefineFrom(NodeRefiner refiner, Lattice lattice, Vec3 k0, int lower, SpectrumTolerances tol, int mesh)
    {
        var p = refiner.Refine(k0, lower, tol.NodeGap, tol.Degeneracy);
        if (p.Converged) return p;
        int dim = lattice.Dimension;
        var u0 = lattice.Reduced(p.K);
        double F(double[] u) => refiner.Gap(lattice.Cartesian(u[0], u[1], dim == 3 ? u[2] : 0), lower);
        double[] x0 = dim == 3 ? [u0.X, u0.Y, u0.Z] : [u0.X, u0.Y];
        // A simplex shrunk below the merge distance (in reduced coordinates) without reaching the target sits on a minimum
        // with a finite gap: nothing closer than that distance could be told apart from it anyway.
        var best = NelderMead.Minimise(F, x0, 0.5 / mesh, PreSearchFraction * tol.PairWidth, SpectrumTolerances.MergeFraction, 2000);
        var k1 = lattice.Cartesian(best.X[0], best.X[1], dim == 3 ? best.X[2] : 0);
        var q = refiner.Refine(k1, lower, tol.NodeGap, tol.Degeneracy);
        return q.Gap < p.Gap ? q : p;
    }

    private static bool AddDistinct(List<Vec3> found, Lattice lattice, Vec3 k, double merge)
    {
        foreach (var f in found) if (PeriodicDistance(lattice, f, k) < merge) return false;
        found.Add(k);
        return true;
    }

    // Images of every node under the lattice's point operations, refined and kept where the bands touch there. With the
    // operations of H(k) known, only their images are tried: those are nodes by symmetry (one diagonalisation confirms
    // each, a refinement polishes it when round-off left it above the target), while an image under a lattice operation
    // that H lacks is no node in general and would cost a failed refinement.
    private static void CompleteOrbits(IBlochSource source, Lattice lattice, List<Vec3> found, int lower, SpectrumTolerances tol, int cap,
                                       SymmetryGroup? group)
    {
        Func<Vec3, Vec3>[] ops = group is { Order: > 1 } g
            ? [.. g.Operations.Select(o => o.ReciprocalMatrix).Distinct().Select(m => (Func<Vec3, Vec3>)(k => Image(lattice, m, k)))]
            : [.. LatticeRotations.Of(lattice).Select(r => (Func<Vec3, Vec3>)(k => LatticeRotations.Apply(r, k)))];
        var refiner = new NodeRefiner(source, tol.ReciprocalLength);
        if (group is { Order: > 1 })
        {
            // found is ordered by ascending gap: each orbit is rebuilt from its best-converged member, so its nodes are
            // exact images of one another (the same energy to round-off), not separately refined near-copies.
            var ordered = new List<Vec3>(found);
            found.Clear();
            foreach (var k in ordered)
            {
                if (found.Count >= cap) break;
                if (!AddDistinct(found, lattice, k, tol.Merge)) continue;
                foreach (var op in ops)
                {
                    var image = op(k);
                    if (found.Any(f => PeriodicDistance(lattice, f, image) < tol.Merge)) continue;
                    var p = refiner.Refine(image, lower, tol.NodeGap, tol.Degeneracy);
                    if (p.Converged) AddDistinct(found, lattice, p.K, tol.Merge);
                    if (found.Count >= cap) break;
                }
            }
            return;
        }
        for (int i = 0; i < found.Count && found.Count < cap; i++)
            foreach (var op in ops)
            {
                var image = op(found[i]);
                if (found.Any(f => PeriodicDistance(lattice, f, image) < tol.Merge)) continue;
                var p = refiner.Refine(image, lower, tol.NodeGap, tol.Degeneracy);
                if (p.Converged) AddDistinct(found, lattice, p.K, tol.Merge);
                if (found.Count >= cap) break;
            }
    }

    /// <summary>Pinned within <see cref="SpectrumTolerances.Pinning"/> of mu, else above or below it.</summary>
    public static NodePinning Pin(double offset, SpectrumTolerances tol) =>
        Math.Abs(offset) <= tol.Pinning ? NodePinning.Pinned : offset > 0 ? NodePinning.Above : NodePinning.Below;

    // S k for an operation's action on reduced coordinates (time reversal's k -> -k included).
    private static Vec3 Image(Lattice lattice, IntMatrix3 m, Vec3 k)
    {
        var u = lattice.Reduced(k);
        return lattice.Cartesian(m.M00 * u.X + m.M01 * u.Y + m.M02 * u.Z, m.M10 * u.X + m.M11 * u.Y + m.M12 * u.Z,
                                 m.M20 * u.X + m.M21 * u.Y + m.M22 * u.Z);
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

    private static List<WeylNode> Characterise(IBlochSource source, List<Vec3> found, int occupied, double mu, SpectrumTolerances tol,
                                               SymmetryGroup? group)
    {
        var lattice = source.Model.Lattice;
        int dim = lattice.Dimension;
        var ks = found.Select(k => NearestImage(lattice, k)).ToList();
        // Every node is diagonalised once: its bands feed the orbit labels, the degeneracy and the energies.
        var values = new double[ks.Count][];
        Parallel.For(0, ks.Count, () => new BlochWorkspace(source), (i, _, ws) =>
        {
            ws.Solve(ks[i], false);
            values[i] = (double[])ws.Values.Clone();
            return ws;
        }, _ => { });
        var orbit = Orbits(lattice, ks, values.Select(v => 0.5 * (v[occupied - 1] + v[occupied])).ToArray(), tol);
        var image = SymmetryImages(lattice, ks, dim == 3 ? group : null, tol);
        var cones = new ConeFit[ks.Count];
        var chirality = new ChiralityResult[ks.Count];
        // Cones everywhere; fluxes only on nodes that are no symmetry image of an earlier one.
        Parallel.For(0, ks.Count, () => new BlochWorkspace(source), (i, _, ws) =>
        {
            cones[i] = ConeFit.Compute(ws, ks[i], occupied - 1, ConeStepFraction * tol.ReciprocalLength, dim);
            if (dim == 3 && image[i].Source == i)
            {
                double nearest = double.PositiveInfinity;
                for (int j = 0; j < ks.Count; j++) if (j != i) nearest = Math.Min(nearest, PeriodicDistance(lattice, ks[i], ks[j]));
                chirality[i] = SphereChirality.Resolve(source, ks[i], nearest, cones[i], occupied, tol);
            }
            return ws;
        }, _ => { });
        var nodes = new WeylNode[ks.Count];
        var location = new string?[ks.Count];
        for (int i = 0; i < ks.Count; i++)
        {
            var k = ks[i];
            var v = values[i];
            double ev = v[occupied - 1], ec = v[occupied], mid = 0.5 * (ev + ec);
            double window = Math.Max(tol.Degeneracy, 10 * (ec - ev));
            int deg = 0;
            for (int n = 0; n < v.Length; n++) if (Math.Abs(v[n] - mid) < window) deg++;
            var cone = cones[i];
            var (src, sign) = image[i];
            // The names are those of the cubic point group, which holds every operation of H(k): an image shares its source's.
            location[i] = src == i ? HighSymmetryLocator.Locate(lattice, k, 1e3 * SpectrumTolerances.MergeFraction) : location[src];
            var chir = src == i ? chirality[i]
                : new ChiralityResult(chirality[src].Chirality * sign, chirality[src].FluxOver2Pi * sign, chirality[src].Radius);
            double offset = mid - mu;
            var pin = Pin(offset, tol);
            var r = lattice.Reduced(k);
            nodes[i] = new WeylNode(k, new Vec3(Fold(r.X), Fold(r.Y), dim == 3 ? Fold(r.Z) : 0), mid, offset, pin, ec - ev,
                chir.Chirality, dim == 3 ? chir.FluxOver2Pi : null, chir.Radius,
                cone.Velocity, cone.Singular, cone.DetVelocity, cone.Tilt, cone.TiltRatio, deg,
                location[i], orbit[i]);
        }
        // Sorted on reduced coordinates rounded to the merge scale, so near-ties order the same way in every run.
        static double Key(double x) => Math.Round(x / SpectrumTolerances.MergeFraction);
        return nodes.OrderBy(n => n.Orbit).ThenBy(n => Key(n.Reduced.X)).ThenBy(n => Key(n.Reduced.Y)).ThenBy(n => Key(n.Reduced.Z)).ToList();
    }

    /// <summary>
    /// For each node, an earlier node that an operation of H(k) maps onto it and the factor its chirality picks up, or
    /// itself. The Berry curvature is a pseudovector: a unitary operation with k-action S multiplies the chirality by
    /// det S, an antiunitary one (time reversal, k -&gt; -k) by -det S, so time reversal keeps it and inversion flips it
    /// (Armitage, Mele &amp; Vishwanath, Rev. Mod. Phys. 90, 015001 (2018), Sec. II.A).
    /// </summary>
    private static (int Source, int Sign)[] SymmetryImages(Lattice lattice, List<Vec3> ks, SymmetryGroup? group, SpectrumTolerances tol)
    {
        var result = new (int Source, int Sign)[ks.Count];
        for (int i = 0; i < ks.Count; i++) result[i] = (i, 1);
        if (group is null || group.Order <= 1) return result;
        for (int i = 0; i < ks.Count; i++)
        {
            if (result[i].Source != i) continue;
            foreach (var op in group.Operations)
            {
                var m = op.ReciprocalMatrix;
                var image = Image(lattice, m, ks[i]);
                int sign = op.TimeReversal ? -m.Determinant : m.Determinant;
                for (int j = i + 1; j < ks.Count; j++)
                    if (result[j].Source == j && PeriodicDistance(lattice, image, ks[j]) < tol.Merge) result[j] = (i, sign);
            }
        }
        return result;
    }

    // Orbit labels: nodes that a lattice operation maps onto each other at the same energy share one (union-find).
    private static int[] Orbits(Lattice lattice, List<Vec3> ks, double[] energy, SpectrumTolerances tol)
    {
        var ops = LatticeRotations.Of(lattice);
        var parent = Enumerable.Range(0, ks.Count).ToArray();
        int Root(int i) { while (parent[i] != i) i = parent[i] = parent[parent[i]]; return i; }
        for (int i = 0; i < ks.Count; i++)
            foreach (var op in ops)
            {
                var image = LatticeRotations.Apply(op, ks[i]);
                for (int j = 0; j < ks.Count; j++)
                    if (j != i && Math.Abs(energy[i] - energy[j]) < tol.Degeneracy && PeriodicDistance(lattice, image, ks[j]) < tol.Merge)
                        parent[Root(j)] = Root(i);
            }
        var label = new Dictionary<int, int>();
        var result = new int[ks.Count];
        // Number orbits by ascending energy, so the report lists the lowest first.
        foreach (int i in Enumerable.Range(0, ks.Count).OrderBy(i => energy[Root(i)]))
        {
            int root = Root(i);
            if (!label.TryGetValue(root, out int id)) label[root] = id = label.Count;
            result[i] = id;
        }
        return result;
    }

    private static double Fold(double x)
    {
        double f = x - Math.Floor(x);
        return f >= 1 - SpectrumTolerances.MergeFraction ? 0 : f;
    }

    // The image k + G closest to Gamma, so that reported Cartesian positions read naturally.
    private static Vec3 NearestImage(Lattice lattice, Vec3 k)
    {
        var best = k;
        int r3 = lattice.Dimension == 3 ? 1 : 0;
        for (int pass = 0; pass < 3; pass++)
            for (int a = -1; a <= 1; a++)
                for (int b = -1; b <= 1; b++)
                    for (int c = -r3; c <= r3; c++)
                    {
                        var q = best + lattice.Cartesian(a, b, c);
                        if (q.Norm < best.Norm * (1 - 1e-12)) best = q;
                    }
        return best;
    }

    /// <summary>Shortest distance between k1 and the images k2 + G (inverse angstrom).</summary>
    public static double PeriodicDistance(Lattice lattice, Vec3 k1, Vec3 k2)
    {
        // Reduce the difference to the cell around the origin first, then look at the neighbouring images.
        var d = lattice.Reduced(k1 - k2);
        var centred = lattice.Cartesian(d.X - Math.Round(d.X), d.Y - Math.Round(d.Y), lattice.Dimension == 3 ? d.Z - Math.Round(d.Z) : 0);
        double best = double.PositiveInfinity;
        int r3 = lattice.Dimension == 3 ? 1 : 0;
        for (int a = -1; a <= 1; a++)
            for (int b = -1; b <= 1; b++)
                for (int c = -r3; c <= r3; c++)
                    best = Math.Min(best, (centred - lattice.Cartesian(a, b, c)).Norm);
        return best;
    }

    private static double ClosestPair(Lattice lattice, IReadOnlyList<WeylNode> nodes)
    {
        double best = double.PositiveInfinity;
        for (int i = 0; i < nodes.Count; i++)
            for (int j = i + 1; j < nodes.Count; j++)
                best = Math.Min(best, PeriodicDistance(lattice, nodes[i].Cartesian, nodes[j].Cartesian));
        return best;
    }
}
