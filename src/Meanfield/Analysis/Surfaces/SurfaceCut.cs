using System.Numerics;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Models;
using Meanfield.Renormalization;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// A crystal cut along a <see cref="LatticePlane"/> with a chosen termination, split into principal layers so that every
/// bond reaches at most the next principal layer; assembles the on-layer block H00(k_par) and the block
/// H01(k_par) = &lt;layer p| H |layer p + 1&gt; (layer p + 1 lies above p, towards the top surface) from the bulk bonds.
/// <para>
/// One elementary layer holds one copy of every site, shifted by stacking vectors so that its heights lie in
/// (h_t - 1, h_t] plane spacings, h_t the height of the termination site: the termination site and every site at its
/// height form the outermost atomic plane of the top surface. A principal layer is <see cref="ElementaryLayers"/>
/// consecutive elementary layers (the largest layer offset of any bond). Block basis index =
/// (sublayer * BasisSize + orbital * F + flavour), sublayer 0 lowest. Phases e^{i k_par.d} over the full bond vector
/// d = R + tau_j - tau_i (site positions included, as in <see cref="BlochHamiltonian"/>), so for k_par + kappa n the bulk H equals
/// H00 + e^{i kappa D} H01 + h.c. up to a diagonal unitary, D = ElementaryLayers x plane spacing (Bloch's theorem
/// along the normal; common practice).
/// </para>
/// The bonds are those of a one-body model: for a mean-field solution, the renormalized model of the bulk saddle point
/// (static r and lambda of the bulk solution, no layer-resolved self-consistency).
/// </summary>
public sealed class SurfaceCut
{
    private readonly int _f, _size;
    private readonly int[] _target, _row, _col, _amp;
    private readonly double[] _dx, _dy, _dz;
    private readonly Complex[] _amplitudes;
    private readonly Complex[] _onsite;   // Size x Size, one elementary layer

    public BoundModel Model { get; }
    public LatticePlane Plane { get; }
    public SurfaceZone Zone { get; }
    /// <summary>Index of the termination site (outermost on the top surface).</summary>
    public int Termination { get; }
    /// <summary>Names of the sites in the outermost atomic plane of the top surface.</summary>
    public IReadOnlyList<string> TopSites { get; }
    /// <summary>Elementary layers per principal layer.</summary>
    public int ElementaryLayers { get; }
    /// <summary>Dimension of one principal-layer block: ElementaryLayers x BasisSize.</summary>
    public int BlockSize { get; }
    /// <summary>Height (plane spacings) of each site after the termination shift, in (h_t - 1, h_t].</summary>
    public IReadOnlyList<double> SiteHeights { get; }

    /// <summary>Heights within this many plane spacings are one atomic plane.</summary>
    public const double HeightTolerance = 1e-6;

    /// <summary>Cuts <paramref name="model"/> along <paramref name="plane"/>; <paramref name="termination"/> names the
    /// outermost site of the top surface (default: the first site).</summary>
    /// <exception cref="RequestError">Unknown termination site (with the closest name), a model that is not 3D.</exception>
    public SurfaceCut(BoundModel model, LatticePlane plane, string? termination = null)
    {
        if (model.Lattice.Dimension != 3) throw new RequestError($"{model.Name}: surfaces need a 3D model, this one is {model.Lattice.Dimension}D");
        Model = model; Plane = plane; Zone = new SurfaceZone(plane);
        _f = model.Flavours; _size = model.BasisSize;
        var names = model.Sites.Select(s => s.Name).ToList();
        Termination = termination is null ? 0 : names.IndexOf(termination);
        if (Termination < 0)
            throw new RequestError($"--top '{termination}': the model has no such site (sites: {string.Join(", ", names)}){NameSuggestion.Format(NameSuggestion.Closest(termination!, names))}");
        var (gx, gy, gz) = plane.Reciprocal;
        int sites = model.Sites.Count;
        var shift = new int[sites];
        var heights = new double[sites];
        double ht = plane.Height(model.Sites[Termination].Position);
        for (int s = 0; s < sites; s++)
        {
            double h = plane.Height(model.Sites[s].Position);
            shift[s] = (int)Math.Ceiling(h - ht - HeightTolerance);
            heights[s] = h - shift[s];
        }
        SiteHeights = heights;
        TopSites = Enumerable.Range(0, sites).Where(s => Math.Abs(heights[s] - ht) <= HeightTolerance).Select(s => names[s]).ToList();

        var hops = model.Hoppings;
        var offset = new int[hops.Count];
        int reach = 0;
        for (int t = 0; t < hops.Count; t++)
        {
            var h = hops[t];
            offset[t] = gx * h.R.N1 + gy * h.R.N2 + gz * h.R.N3 + shift[model.Orbitals[h.To].Site] - shift[model.Orbitals[h.From].Site];
            reach = Math.Max(reach, Math.Abs(offset[t]));
        }
        int p = Math.Max(1, reach);
        ElementaryLayers = p; BlockSize = p * _size;

        int terms = hops.Count * p;
        _target = new int[terms]; _row = new int[terms]; _col = new int[terms]; _amp = new int[terms];
        _dx = new double[terms]; _dy = new double[terms]; _dz = new double[terms];
        _amplitudes = new Complex[hops.Count * _f * _f];
        for (int t = 0, i = 0; t < hops.Count; t++)
        {
            var h = hops[t];
            h.Amplitude.Elements.CopyTo(_amplitudes.AsSpan(t * _f * _f, _f * _f));
            var d = model.Lattice.LatticeVector(h.R.N1, h.R.N2, h.R.N3)
                    + model.Sites[model.Orbitals[h.To].Site].Position - model.Sites[model.Orbitals[h.From].Site].Position;
            for (int q = 0; q < p; q++, i++)
            {
                int to = q + offset[t], layer = (int)Math.Floor((double)to / p), qt = to - layer * p;
                _target[i] = layer + 1;   // 0: bond to the layer below, 1: same layer, 2: layer above
                _row[i] = q * _size + h.From * _f; _col[i] = qt * _size + h.To * _f; _amp[i] = t * _f * _f;
                _dx[i] = d.X; _dy[i] = d.Y; _dz[i] = d.Z;
            }
        }
        _onsite = new Complex[_size * _size];
        foreach (var o in model.Onsite)
            for (int a = 0; a < _f; a++)
                for (int b = 0; b < _f; b++)
                    _onsite[(o.Orbital * _f + a) * _size + o.Orbital * _f + b] += o.Amplitude[a, b];
        foreach (var s in model.Shells)
            for (int a = 0; a < _f; a++) _onsite[(s.Orbital * _f + a) * _size + s.Orbital * _f + a] += s.Level;
    }

    /// <summary>
    /// The one-body model whose bonds give the Hamiltonian of <paramref name="source"/>: the bare model, or for a
    /// mean-field Hamiltonian the renormalized model of its (bulk) saddle point.
    /// </summary>
    /// <exception cref="ArgumentException">A source with no real-space bonds (neither bare nor renormalized).</exception>
    public static BoundModel BondsOf(IBlochSource source) => source switch
    {
        RenormalizedHamiltonian r => RenormalizedModel.Build(r.Model, r.Amplitudes),
        BlochHamiltonian b => b.Model,
        _ => throw new ArgumentException($"{source.GetType().Name}: a surface needs the real-space bonds of a bare or renormalized model"),
    };

    /// <summary>
    /// Writes H00(k_par) and H01(k_par) (BlockSize x BlockSize each, overwritten) for an in-plane Cartesian wave vector
    /// (inverse angstrom). Allocates nothing.
    /// </summary>
    public void Assemble(Vec3 kPar, Span<Complex> h00, Span<Complex> h01)
    {
        int n = BlockSize, f = _f, size = _size;
        h00[..(n * n)].Clear(); h01[..(n * n)].Clear();
        for (int q = 0; q < ElementaryLayers; q++)
            for (int i = 0; i < size; i++)
                for (int j = 0; j < size; j++)
                    h00[(q * size + i) * n + q * size + j] = _onsite[i * size + j];
        for (int t = 0; t < _target.Length; t++)
        {
            var (s, c) = Math.SinCos(kPar.X * _dx[t] + kPar.Y * _dy[t] + kPar.Z * _dz[t]);
            int r0 = _row[t], c0 = _col[t], a0 = _amp[t], target = _target[t];
            for (int a = 0; a < f; a++)
                for (int b = 0; b < f; b++)
                {
                    var amp = _amplitudes[a0 + a * f + b];
                    var v = new Complex(amp.Real * c - amp.Imaginary * s, amp.Real * s + amp.Imaginary * c);
                    int r = r0 + a, cc = c0 + b;
                    switch (target)
                    {
                        case 1: h00[r * n + cc] += v; h00[cc * n + r] += Complex.Conjugate(v); break;
                        case 2: h01[r * n + cc] += v; break;
                        default: h01[cc * n + r] += Complex.Conjugate(v); break;
                    }
                }
        }
    }

    /// <summary>
    /// Diagonal of an extra potential on one principal layer: <paramref name="skin"/>.Shift on every orbital of the
    /// elementary layers that lie within the outermost <paramref name="skin"/>.Depth elementary layers of the top face
    /// (<paramref name="fromTop"/> = principal layers counted from the top, 0 outermost), else 0.
    /// </summary>
    public void SkinDiagonal(SkinPotential skin, int fromTop, Span<double> diagonal)
    {
        int p = ElementaryLayers;
        for (int q = 0; q < p; q++)
        {
            bool inside = fromTop * p + (p - 1 - q) < skin.Depth;
            diagonal.Slice(q * _size, _size).Fill(inside ? skin.Shift : 0);
        }
    }

    /// <summary>Principal layers (from the top) that an extra potential touches.</summary>
    public int SkinLayers(SkinPotential? skin) => skin is null || skin.Depth == 0 ? 0 : (skin.Depth + ElementaryLayers - 1) / ElementaryLayers;
}

/// <summary>An extra on-site energy <paramref name="Shift"/> (energy unit) on every orbital of the outermost
/// <paramref name="Depth"/> elementary layers (a surface potential: band bending, a changed surface f level).</summary>
public sealed record SkinPotential(double Shift, int Depth)
{
    /// <summary>Checks the depth (0..1000 elementary layers) and that the shift is finite.</summary>
    /// <exception cref="RequestError">Negative or huge depth, or a shift that is not a finite number.</exception>
    public void Validate()
    {
        if (Depth is < 0 or > 1000) throw new RequestError($"--skin {Shift:G6} {Depth}: the depth must be 0..1000 elementary layers");
        if (!double.IsFinite(Shift)) throw new RequestError($"--skin {Shift} {Depth}: the shift must be a finite number");
    }
}
