using System.Numerics;

namespace Meanfield.Analysis.Surfaces;

/// <summary>
/// Surface and bulk Green functions of a semi-infinite stack of identical principal layers by the decimation of
/// Lopez Sancho, Lopez Sancho &amp; Rubio, J. Phys. F 15, 851 (1985): each step removes every other layer, so the
/// effective couplings alpha_i, beta_i shrink quadratically and O(log(1/eta)) steps reach the semi-infinite limit.
/// One instance per thread (it owns its buffers); <see cref="Solve"/> allocates nothing.
/// </summary>
public sealed class Decimation
{
    /// <summary>Converged when the effective couplings fall below this fraction of the largest block element.</summary>
    public const double CouplingTolerance = 1e-12;
    /// <summary>Most decimation steps (2^64 layers: far beyond any broadening above the double-precision floor).</summary>
    public const int MaxSteps = 64;

    private readonly int _n;
    private readonly Complex[] _es, _e, _a, _b, _g, _ga, _gb, _m, _gs, _gbulk;

    public int Size => _n;
    /// <summary>The surface-layer Green function G_s(z) of the last <see cref="Solve"/> (n x n, row-major).</summary>
    public ReadOnlySpan<Complex> Surface => _gs;
    /// <summary>The bulk-layer Green function G_b(z) of the last <see cref="Solve"/>.</summary>
    public ReadOnlySpan<Complex> Bulk => _gbulk;

    public Decimation(int n)
    {
        _n = n;
        int m = n * n;
        _es = new Complex[m]; _e = new Complex[m]; _a = new Complex[m]; _b = new Complex[m]; _g = new Complex[m];
        _ga = new Complex[m]; _gb = new Complex[m]; _m = new Complex[m]; _gs = new Complex[m]; _gbulk = new Complex[m];
    }

    /// <summary>
    /// Solves for z = E + i eta (eta &gt; 0). <paramref name="h00"/> is the layer block, <paramref name="toDeeper"/> the
    /// coupling &lt;surface layer| H |next deeper layer&gt;; its adjoint is the coupling back. Optional
    /// <paramref name="skin"/>: diagonals (energy unit) added to the outermost <paramref name="skinLayers"/> layers
    /// (skin[l * n + i], l = 0 outermost), attached on top of the unperturbed semi-infinite crystal by Dyson's equation.
    /// </summary>
    /// <returns>-Im Tr G / pi of the surface and of a bulk layer (states per energy unit per layer cell), the steps
    /// taken and whether the couplings converged; a singular step stops early and is reported as not converged.</returns>
    public DecimationResult Solve(ReadOnlySpan<Complex> h00, ReadOnlySpan<Complex> toDeeper, Complex z,
                                  ReadOnlySpan<double> skin = default, int skinLayers = 0)
    {
        int n = _n, nn = n * n;
        h00[..nn].CopyTo(_es); h00[..nn].CopyTo(_e);
        toDeeper[..nn].CopyTo(_a);
        ComplexBlocks.Adjoint(n, toDeeper, _b);
        double scale = Math.Max(ComplexBlocks.MaxAbs(n, h00), ComplexBlocks.MaxAbs(n, toDeeper));
        double tol = CouplingTolerance * Math.Max(scale, 1e-300);
        bool converged = false, singular = false;
        int step = 0;
        while (step < MaxSteps)
        {
            if (ComplexBlocks.MaxAbs(n, _a) + ComplexBlocks.MaxAbs(n, _b) <= tol) { converged = true; break; }
            step++;
            // g = (z - eps)^-1 of the layers being removed.
            Shifted(z, _e, _m);
            if (!ComplexBlocks.Invert(n, _m, _g)) { singular = true; break; }
            ComplexBlocks.Multiply(n, _g, _a, _ga);            // g alpha
            ComplexBlocks.Multiply(n, _g, _b, _gb);            // g beta
            ComplexBlocks.MultiplyAdd(n, _a, _gb, _es);        // eps_s += alpha g beta
            ComplexBlocks.MultiplyAdd(n, _a, _gb, _e);         // eps += alpha g beta + beta g alpha
            ComplexBlocks.MultiplyAdd(n, _b, _ga, _e);
            ComplexBlocks.Multiply(n, _a, _ga, _m); _m.AsSpan(0, nn).CopyTo(_a);   // alpha <- alpha g alpha
            ComplexBlocks.Multiply(n, _b, _gb, _m); _m.AsSpan(0, nn).CopyTo(_b);   // beta <- beta g beta
        }
        Shifted(z, _es, _m);
        singular |= !ComplexBlocks.Invert(n, _m, _gs);
        Shifted(z, _e, _m);
        singular |= !ComplexBlocks.Invert(n, _m, _gbulk);
        if (skinLayers > 0 && !singular)
        {
            // Layers with the extra potential, from the deepest up: G <- (z - H00 - V - alpha G beta)^-1, with
            // alpha, beta the bare couplings again.
            toDeeper[..nn].CopyTo(_a);
            ComplexBlocks.Adjoint(n, toDeeper, _b);
            for (int l = skinLayers - 1; l >= 0; l--)
            {
                ComplexBlocks.Multiply(n, _gs, _b, _gb);
                ComplexBlocks.Multiply(n, _a, _gb, _g);           // alpha G beta
                for (int i = 0; i < nn; i++) _m[i] = -h00[i] - _g[i];
                for (int i = 0; i < n; i++) _m[i * n + i] += z - skin[l * n + i];
                singular |= !ComplexBlocks.Invert(n, _m, _gs);
            }
        }
        double surface = -Trace(_gs).Imaginary / Math.PI, bulk = -Trace(_gbulk).Imaginary / Math.PI;
        bool finite = double.IsFinite(surface) && double.IsFinite(bulk);
        return new DecimationResult(finite ? surface : 0, finite ? bulk : 0, step, converged && !singular && finite);
    }

    private void Shifted(Complex z, ReadOnlySpan<Complex> eps, Span<Complex> m)
    {
        int n = _n;
        for (int i = 0; i < n * n; i++) m[i] = -eps[i];
        for (int i = 0; i < n; i++) m[i * n + i] += z;
    }

    private Complex Trace(ReadOnlySpan<Complex> g)
    {
        Complex t = 0;
        for (int i = 0; i < _n; i++) t += g[i * _n + i];
        return t;
    }
}

/// <summary>Spectral weights of one decimation: A_s = -Im Tr G_s / pi, A_b = -Im Tr G_b / pi (states per energy unit
/// per principal-layer cell), decimation steps, and whether the couplings converged (0 weights when not finite).</summary>
public readonly record struct DecimationResult(double Surface, double Bulk, int Steps, bool Converged);
