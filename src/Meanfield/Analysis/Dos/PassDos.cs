using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Solver;
using Meanfield.Symmetry;

namespace Meanfield.Analysis.Dos;

/// <summary>
/// The DOS at one energy (the Fermi level) by the linear tetrahedron method (triangles in 2D) from a
/// <see cref="ZonePass"/>: band energies and correlated weights of the wedge, read at every corner of the full mesh
/// through the orbit map. Same cut of the cells and same corner weights as <see cref="TetrahedronDos.DosAtEnergy"/>
/// (Bloechl, Jepsen &amp; Andersen, PRB 49, 16223 (1994)), so both agree to round-off (tested); this one walks the cells
/// without a corner table and skips every band whose range over the mesh misses the energy, and every cell whose
/// corners all lie on one side of it (their tetrahedra carry no weight there).
/// </summary>
public static class PassDos
{
    /// <summary>
    /// The conduction DOS at <paramref name="energy"/> of a decoupled (r = 0) solution: every f level moved far above
    /// the spectrum (the shells decouple exactly at r = 0), so the bands near the energy are conduction bands only.
    /// Tetrahedra cannot take it from the solution's own bands, where the flat f level at mu crosses the conduction band
    /// and band indices swap character inside a cell. The one rule for the DOS at mu of free moments (digest and `dos`).
    /// </summary>
    public static double DecoupledConductionAt(BoundModel model, IrreducibleMesh wedge, double energy)
    {
        int groups = model.ShellGroups().Count;
        double far = DecoupledLevelShift * (1 + model.Shells.Max(s => Math.Abs(s.Level)) + Math.Abs(energy));
        var h = new Renormalization.RenormalizedHamiltonian(new BlochHamiltonian(model), new Renormalization.MeanFieldAmplitudes(new double[groups], Enumerable.Repeat(far, groups).ToArray()));
        return AtEnergy(Diagonalise(h, wedge), energy).Conduction;
    }

    /// <summary>How far above the spectrum (relative to its largest level) <see cref="DecoupledConductionAt"/> moves the f levels.</summary>
    private const double DecoupledLevelShift = 1e6;

    /// <summary>Total, correlated and conduction DOS at <paramref name="energy"/> (states per cell per energy unit).</summary>
    public static DosValue AtEnergy(ZonePass pass, double energy, bool bloechl = true)
    {
        var mesh = pass.Wedge.Mesh;
        int dim = mesh.Lattice.Dimension, nc = dim == 3 ? 4 : 3, corners = dim == 3 ? 8 : 4, bands = pass.Bands;
        if (dim < 2) throw new ArgumentException("The DOS on a mesh needs a lattice with momentum.");
        var pattern = Dos.MeshSimplices.CellPattern(mesh);
        int perCell = pattern.Length / nc;
        double weight = 1.0 / ((double)mesh.Count * perCell);
        var rows = pass.RowOfPoint;
        var e = pass.Energies; var f = pass.Correlated;
        var active = new List<int>();
        for (int n = 0; n < bands; n++)
        {
            double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
            for (int w = 0; w < pass.Wedge.Count; w++) { lo = Math.Min(lo, e[w * bands + n]); hi = Math.Max(hi, e[w * bands + n]); }
            if (lo < energy && hi > energy) active.Add(n);
        }
        if (active.Count == 0) return new DosValue(0, 0, 0);
        var bandList = active.ToArray();
        // One partial sum per slice i1, added in slice order: the value does not depend on which thread ran which slice.
        var sliceTotal = new double[mesh.N1];
        var sliceCorrelated = new double[mesh.N1];
        Parallel.For(0, mesh.N1, i1 =>
        {
            double sumTotal = 0, sumCorrelated = 0;
            Span<int> row = stackalloc int[8];
            Span<double> ce = stackalloc double[8], te = stackalloc double[4], g = stackalloc double[4];
            Span<int> order = stackalloc int[4];
            for (int i2 = 0; i2 < mesh.N2; i2++)
                for (int i3 = 0; i3 < mesh.N3; i3++)
                {
                    for (int c = 0; c < corners; c++) row[c] = rows[mesh.Index(i1 + (c & 1), i2 + ((c >> 1) & 1), i3 + ((c >> 2) & 1))];
                    foreach (int n in bandList)
                    {
                        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
                        for (int c = 0; c < corners; c++) { ce[c] = e[row[c] * bands + n]; lo = Math.Min(lo, ce[c]); hi = Math.Max(hi, ce[c]); }
                        if (!(lo < energy && hi > energy)) continue;
                        for (int s = 0; s < perCell; s++)
                        {
                            for (int c = 0; c < nc; c++) { te[c] = ce[pattern[s * nc + c]]; order[c] = pattern[s * nc + c]; }
                            Sort(te, order, nc);
                            double d = nc == 4 ? SimplexKernel.TetraCornerWeights(te, energy, g, bloechl) : SimplexKernel.TriangleCornerWeights(te, energy, g);
                            sumTotal += weight * d;
                            for (int c = 0; c < nc; c++) sumCorrelated += weight * g[c] * f[row[order[c]] * bands + n];
                        }
                    }
                }
            sliceTotal[i1] = sumTotal; sliceCorrelated[i1] = sumCorrelated;
        });
        double total = 0, correlated = 0;
        for (int i1 = 0; i1 < mesh.N1; i1++) { total += sliceTotal[i1]; correlated += sliceCorrelated[i1]; }
        return new DosValue(total, correlated, total - correlated);
    }

    /// <summary>
    /// A fresh pass of <paramref name="source"/> over <paramref name="wedge"/> (energies and correlated weights), for a
    /// Hamiltonian whose solve left no pass (a loaded solution, the bare model). Kind weights are the same across an
    /// orbit, so the wedge suffices even when an operation exchanges sites.
    /// </summary>
    public static ZonePass Diagonalise(IBlochSource source, IrreducibleMesh wedge)
    {
        var model = source.Model;
        int n = source.Size, f = model.Flavours, count = wedge.Count;
        var reps = wedge.Representatives.ToArray();
        var correlatedIndex = new bool[n];
        for (int i = 0; i < n; i++) correlatedIndex[i] = model.Orbitals[i / f].Kind == OrbitalKind.Correlated;
        var energies = new double[count * n]; var weights = new double[count * n];
        Parallel.For(0, count, () => new BlochWorkspace(source), (w, _, ws) =>
        {
            ws.Solve(wedge.Mesh.Cartesian(reps[w]), withVectors: true);
            ws.Values.AsSpan().CopyTo(energies.AsSpan(w * n, n));
            for (int m = 0; m < n; m++)
            {
                double p = 0;
                for (int i = 0; i < n; i++)
                    if (correlatedIndex[i]) p += ws.Vectors[i * n + m].Real * ws.Vectors[i * n + m].Real + ws.Vectors[i * n + m].Imaginary * ws.Vectors[i * n + m].Imaginary;
                weights[w * n + m] = p;
            }
            return ws;
        }, _ => { });
        return new ZonePass(wedge, n, energies, weights, null);
    }

    private static void Sort(Span<double> e, Span<int> order, int n)
    {
        for (int i = 1; i < n; i++)
        {
            double v = e[i]; int o = order[i], j = i - 1;
            while (j >= 0 && e[j] > v) { e[j + 1] = e[j]; order[j + 1] = order[j]; j--; }
            e[j + 1] = v; order[j + 1] = o;
        }
    }
}
