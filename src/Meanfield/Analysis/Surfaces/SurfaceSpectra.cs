using System.Numerics;
using Meanfield.Lattices;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// The surface spectral function A_s(k_par, E) = -Im Tr G_s / pi of the semi-infinite crystal below the top face of a
/// <see cref="SurfaceCut"/> (trace over the outermost principal layer) and the bulk-projected A_b = -Im Tr G_b / pi of
/// one principal layer of the infinite crystal, by <see cref="Decimation"/> at z = E + i eta. Units: states per energy
/// unit per surface cell and principal layer. Parallel over k_par, one decimation workspace per thread.
/// </summary>
public static class SurfaceSpectra
{
    /// <summary>A_s and A_b along a surface path at the given energies.</summary>
    /// <exception cref="ArgumentException">eta not positive, or no energies.</exception>
    public static SurfacePathSpectrum AlongPath(SurfaceCut cut, BandPathSample path, IReadOnlyList<double> energies,
                                                double eta, SkinPotential? skin = null)
    {
        Check(eta);
        if (energies.Count == 0) throw new ArgumentException("surface spectrum: no energies");
        int ne = energies.Count;
        var s = new double[path.Count, ne];
        var b = new double[path.Count, ne];
        int failed = 0;
        Parallel.For(0, path.Count, () => new Worker(cut, skin), (k, _, w) =>
        {
            w.Prepare(path.K[k]);
            for (int e = 0; e < ne; e++)
            {
                var r = w.Solve(new Complex(energies[e], eta));
                s[k, e] = r.Surface; b[k, e] = r.Bulk;
                if (!r.Converged) Interlocked.Increment(ref failed);
            }
            return w;
        }, _ => { });
        return new SurfacePathSpectrum(path, [.. energies], s, b, eta, failed);
    }

    /// <summary>
    /// A_s and A_b at one energy on an n1 x n2 grid of in-plane map coordinates (s1, s2) (inverse angstrom along the
    /// zone's E1, E2) covering [s1min, s1max] x [s2min, s2max] (cell centres); by default the box around the
    /// Wigner-Seitz cell of the surface zone.
    /// </summary>
    /// <exception cref="ArgumentException">eta not positive, or fewer than 2 points per side.</exception>
    public static SurfaceMap Map(SurfaceCut cut, double energy, double eta, int n1, int n2, SkinPotential? skin = null,
                                 (double S1Min, double S1Max, double S2Min, double S2Max)? window = null)
    {
        Check(eta);
        if (n1 < 2 || n2 < 2) throw new ArgumentException($"surface map {n1} x {n2}: need at least 2 points per side");
        var box = window ?? ZoneBox(cut.Zone);
        var s1 = new double[n1]; var s2 = new double[n2];
        for (int i = 0; i < n1; i++) s1[i] = box.S1Min + (i + 0.5) * (box.S1Max - box.S1Min) / n1;
        for (int j = 0; j < n2; j++) s2[j] = box.S2Min + (j + 0.5) * (box.S2Max - box.S2Min) / n2;
        var s = new double[n1, n2]; var b = new double[n1, n2];
        int failed = 0;
        var z = new Complex(energy, eta);
        Parallel.For(0, n1 * n2, () => new Worker(cut, skin), (idx, _, w) =>
        {
            int i = idx / n2, j = idx % n2;
            w.Prepare(cut.Zone.FromMap(s1[i], s2[j]));
            var r = w.Solve(z);
            s[i, j] = r.Surface; b[i, j] = r.Bulk;
            if (!r.Converged) Interlocked.Increment(ref failed);
            return w;
        }, _ => { });
        return new SurfaceMap(s1, s2, s, b, energy, eta, failed);
    }

    /// <summary>The (e1, e2) bounding box of the Wigner-Seitz cell of the surface zone.</summary>
    public static (double S1Min, double S1Max, double S2Min, double S2Max) ZoneBox(SurfaceZone zone) =>
        (zone.Boundary.Min(p => p.S1), zone.Boundary.Max(p => p.S1), zone.Boundary.Min(p => p.S2), zone.Boundary.Max(p => p.S2));

    private static void Check(double eta)
    {
        if (!(eta > 0) || !double.IsFinite(eta)) throw new ArgumentException($"broadening eta = {eta}: must be a positive number");
    }

    /// <summary>Per-thread blocks and decimation workspace for the top face.</summary>
    internal sealed class Worker
    {
        private readonly SurfaceCut _cut;
        private readonly Decimation _decimation;
        private readonly Complex[] _h00, _h01, _down;
        private readonly double[] _skin;
        private readonly int _skinLayers;

        public Worker(SurfaceCut cut, SkinPotential? skin)
        {
            _cut = cut;
            int n = cut.BlockSize;
            _decimation = new Decimation(n);
            _h00 = new Complex[n * n]; _h01 = new Complex[n * n]; _down = new Complex[n * n];
            _skinLayers = cut.SkinLayers(skin);
            _skin = new double[Math.Max(1, _skinLayers) * n];
            for (int l = 0; l < _skinLayers; l++) cut.SkinDiagonal(skin!, l, _skin.AsSpan(l * n, n));
        }

        public Decimation Decimation => _decimation;

        /// <summary>Blocks at k_par; the coupling from the top layer to the one below is H01^dagger.</summary>
        public void Prepare(Vec3 kPar)
        {
            _cut.Assemble(kPar, _h00, _h01);
            ComplexBlocks.Adjoint(_cut.BlockSize, _h01, _down);
        }

        public DecimationResult Solve(Complex z) => _decimation.Solve(_h00, _down, z, _skin, _skinLayers);
    }
}

/// <summary>A_s(k, E) and A_b(k, E) along a path ([k, energy]); <paramref name="NotConverged"/> counts (k, E) points
/// whose decimation did not converge (reported, their values kept as computed, 0 if not finite).</summary>
public sealed record SurfacePathSpectrum(BandPathSample Path, double[] Energies, double[,] Surface, double[,] Bulk,
                                         double Eta, int NotConverged);

/// <summary>A_s and A_b on a grid of map coordinates ([i along S1, j along S2]) at one energy.</summary>
public sealed record SurfaceMap(double[] S1, double[] S2, double[,] Surface, double[,] Bulk, double Energy, double Eta,
                                int NotConverged);
