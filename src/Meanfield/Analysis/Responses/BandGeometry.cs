using System.Numerics;
using Meanfield.Bloch;
using Meanfield.Lattices;
using Meanfield.Numerics;

namespace Meanfield.Analysis.Responses;

/// <summary>
/// Per-thread buffers for the band geometry at one k: energies, band velocities dE_n/dk_a (energy unit x angstrom)
/// and Berry curvature pseudovectors Omega_n = (Omega^yz, Omega^zx, Omega^xy) (square angstrom) by the Kubo form
/// Omega_n^ab = -2 Im sum_{m != n} &lt;n|d_a H|m&gt;&lt;m|d_b H|n&gt; / (E_n - E_m)^2
/// (Xiao, Chang &amp; Niu, Rev. Mod. Phys. 82, 1959 (2010), Eq. 1.13), the curl of A = i&lt;u|grad u&gt;, the same sign
/// as the link-variable curvature of <see cref="Curvature.BerryCurvature"/>. Pairs degenerate within
/// <see cref="ResponseTolerances.Degeneracy"/> are left out, and within such a multiplet velocities and curvatures are
/// replaced by their multiplet averages (basis independent). <see cref="Compute"/> allocates nothing.
/// </summary>
public sealed class BandGeometry
{
    private readonly IBlochSource _source;
    private readonly VelocityOperator _velocity;
    private readonly IHermitianEigensolver _solver;
    private readonly Complex[] _h, _scratch, _u, _d0, _d1, _d2, _t, _v0, _v1, _v2;

    /// <summary>Number of bands.</summary>
    public int Size { get; }
    /// <summary>E_n, ascending (energy unit).</summary>
    public double[] Energies { get; }
    /// <summary>dE_n/dk_a at [n * 3 + a] (energy unit x angstrom).</summary>
    public double[] Velocities { get; }
    /// <summary>Omega_n along a at [n * 3 + a] (square angstrom).</summary>
    public double[] Curvatures { get; }

    /// <summary>Buffers for <paramref name="source"/> with its velocity operator (one instance per thread).</summary>
    public BandGeometry(IBlochSource source, VelocityOperator velocity)
    {
        _source = source; _velocity = velocity; Size = source.Size;
        int nn = Size * Size;
        _solver = Eigensolvers.Create(Size);
        _h = new Complex[nn]; _scratch = new Complex[3 * nn]; _u = new Complex[nn];
        _d0 = new Complex[nn]; _d1 = new Complex[nn]; _d2 = new Complex[nn]; _t = new Complex[nn];
        _v0 = new Complex[nn]; _v1 = new Complex[nn]; _v2 = new Complex[nn];
        Energies = new double[Size]; Velocities = new double[3 * Size]; Curvatures = new double[3 * Size];
    }

    /// <summary>Fills <see cref="Energies"/>, <see cref="Velocities"/> and <see cref="Curvatures"/> at the Cartesian k (1/angstrom).</summary>
    public void Compute(Vec3 k)
    {
        int n = Size;
        _source.Assemble(k, _h, _scratch);
        _solver.Solve(_h, Energies, _u);
        _velocity.Assemble(k, _d0, _d1, _d2, _scratch);
        ToEigenbasis(_d0, _v0); ToEigenbasis(_d1, _v1); ToEigenbasis(_d2, _v2);
        double scale = 0;
        for (int i = 0; i < n; i++) scale = Math.Max(scale, Math.Abs(Energies[i]));
        double tol = ResponseTolerances.Degeneracy * Math.Max(scale, 1e-300);
        for (int b = 0; b < n; b++)
        {
            Velocities[3 * b] = _v0[b * n + b].Real; Velocities[3 * b + 1] = _v1[b * n + b].Real; Velocities[3 * b + 2] = _v2[b * n + b].Real;
            double oyz = 0, ozx = 0, oxy = 0;
            for (int m = 0; m < n; m++)
            {
                double de = Energies[b] - Energies[m];
                if (m == b || Math.Abs(de) < tol) continue;
                double w = -2 / (de * de);
                oyz += w * (_v1[b * n + m] * _v2[m * n + b]).Imaginary;
                ozx += w * (_v2[b * n + m] * _v0[m * n + b]).Imaginary;
                oxy += w * (_v0[b * n + m] * _v1[m * n + b]).Imaginary;
            }
            Curvatures[3 * b] = oyz; Curvatures[3 * b + 1] = ozx; Curvatures[3 * b + 2] = oxy;
        }
        AverageMultiplets(tol);
    }

    // Within a degenerate multiplet single-band velocities and curvatures depend on the basis chosen inside it; their
    // multiplet averages (traces over the multiplet divided by its size) do not, and keep every multiplet sum.
    private void AverageMultiplets(double tol)
    {
        int n = Size;
        for (int start = 0; start < n;)
        {
            int end = start + 1;
            while (end < n && Energies[end] - Energies[end - 1] < tol) end++;
            if (end - start > 1)
                for (int a = 0; a < 3; a++)
                {
                    double v = 0, o = 0;
                    for (int b = start; b < end; b++) { v += Velocities[3 * b + a]; o += Curvatures[3 * b + a]; }
                    v /= end - start; o /= end - start;
                    for (int b = start; b < end; b++) { Velocities[3 * b + a] = v; Curvatures[3 * b + a] = o; }
                }
            start = end;
        }
    }

    // V = U^dag D U with U the eigenvectors as columns.
    private void ToEigenbasis(Complex[] d, Complex[] v)
    {
        int n = Size;
        for (int i = 0; i < n; i++)
            for (int q = 0; q < n; q++)
            {
                Complex s = 0;
                for (int j = 0; j < n; j++) s += d[i * n + j] * _u[j * n + q];
                _t[i * n + q] = s;
            }
        for (int p = 0; p < n; p++)
            for (int q = 0; q < n; q++)
            {
                Complex s = 0;
                for (int i = 0; i < n; i++) s += Complex.Conjugate(_u[i * n + p]) * _t[i * n + q];
                v[p * n + q] = s;
            }
    }
}
