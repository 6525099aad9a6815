using Meanfield.Lattices;
using Meanfield.Renormalization;
using Meanfield.Solver;

namespace Meanfield.Tests.FiniteU;

/// <summary>
/// Limits of the paramagnetic finite-U Kotliar-Ruckenstein saddle point (Kotliar &amp; Ruckenstein, PRL 57, 1362 (1986))
/// of the one-band Hubbard model on a model DOS at T = 0.
/// </summary>
public class BrinkmanRiceTests
{
    private const double D = 1.0;

    // Free kinetic energy at half filling, summed over both spins (derived here):
    //   flat rho = 1/(2D):                per spin Int_{-D}^0 eps/(2D) d eps = -D/4, both spins -D/2.
    //   semi-elliptic rho = 2 sqrt(D^2 - eps^2)/(pi D^2): per spin -(2/(pi D^2)) Int_0^D eps sqrt(D^2 - eps^2) d eps
    //                                     = -(2/(pi D^2)) D^3/3 = -2D/(3 pi), both spins -4D/(3 pi).
    // Brinkman & Rice, PRB 2, 4302 (1970): U_c = 8 |e_kin|, so U_c = 4D (flat) and 32 D/(3 pi) (semi-elliptic).
    public static TheoryData<LatticeKind, double, double> Cases => new()
    {
        { LatticeKind.FlatDos, -D / 2, 4 * D },
        { LatticeKind.SemiEllipticDos, -4 * D / (3 * Math.PI), 32 * D / (3 * Math.PI) },
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void Free_kinetic_energy_at_half_filling(LatticeKind dos, double ekin, double _) =>
        Assert.Equal(ekin, FiniteUHubbardDos.FreeKineticEnergy(dos, D, 1.0), 1e-12);

    // U = 0: the four-boson normalization makes z = 1 at the uncorrelated double occupancy d^2 = (n/2)^2
    // (Kotliar & Ruckenstein 1986, the choice of normalization factors in their Eq. 5).
    [Theory]
    [InlineData(LatticeKind.FlatDos, 1.0)]
    [InlineData(LatticeKind.FlatDos, 0.6)]
    [InlineData(LatticeKind.SemiEllipticDos, 1.0)]
    [InlineData(LatticeKind.SemiEllipticDos, 1.3)]
    public void Zero_U_gives_z_one_and_uncorrelated_double_occupancy(LatticeKind dos, double n)
    {
        var s = FiniteUHubbardDos.Solve(dos, D, 0, n);
        Assert.True(s.Converged);
        Assert.Equal(1.0, s.Z, 1e-9);
        Assert.Equal(n * n / 4, s.Amplitudes.D * s.Amplitudes.D, 1e-5);
        Assert.Equal(s.FreeKineticEnergy, s.Energy, 1e-9);
    }

    // Half filling: z(U) = 1 - (U/U_c)^2 below U_c and z = 0 above (Brinkman & Rice 1970, Eqs. for the Gutzwiller
    // approximation; derived: at n = 1, z = 8x(1 - 2x) with x = d^2, F = 16|e_kin| x^2 + (U - 8|e_kin|) x, minimum
    // x = (1 - U/U_c)/4, z = 1 - (U/U_c)^2). The solver minimizes F numerically, so this checks the amplitudes, the
    // DOS integral and the minimization against the closed form.
    [Theory]
    [MemberData(nameof(Cases))]
    public void Half_filling_follows_Brinkman_Rice(LatticeKind dos, double _, double uc)
    {
        foreach (double ratio in (double[])[0.1, 0.25, 0.5, 0.75, 0.9, 0.99])
        {
            var s = FiniteUHubbardDos.Solve(dos, D, ratio * uc, 1.0);
            Assert.True(s.Converged);
            Assert.Equal(1 - ratio * ratio, s.Z, 1e-9);
            Assert.Equal((1 - ratio) / 4, s.Amplitudes.D * s.Amplitudes.D, 1e-9);
            Assert.Equal(s.Amplitudes.D, s.Amplitudes.E, 1e-9); // particle-hole symmetry: e = d at n = 1
        }
        foreach (double ratio in (double[])[1.01, 1.5, 3])
            Assert.Equal(0.0, FiniteUHubbardDos.Solve(dos, D, ratio * uc, 1.0).Z, 1e-12);
    }

    // U_c located numerically (bisection on z > 0) against 4D and 32D/(3 pi): relative 1e-8.
    [Theory]
    [MemberData(nameof(Cases))]
    public void Transition_point_is_eight_times_the_kinetic_energy(LatticeKind dos, double _, double uc)
    {
        double lo = 0, hi = 10 * D;
        for (int i = 0; i < 80; i++)
        {
            double m = 0.5 * (lo + hi);
            if (FiniteUHubbardDos.Solve(dos, D, m, 1.0).Z > 1e-12) lo = m; else hi = m;
        }
        Assert.Equal(uc, 0.5 * (lo + hi), 1e-8 * uc);
    }

    // The Kotliar-Ruckenstein z at any filling equals the Gutzwiller factor
    // q = [sqrt((n/2 - x)(1 - n + x)) + sqrt((n/2 - x) x)]^2 / [(n/2)(1 - n/2)], x the double occupancy
    // (Vollhardt, Rev. Mod. Phys. 56, 99 (1984), the Gutzwiller approximation; form from memory).
    [Theory]
    [InlineData(0.4, 0.01)]
    [InlineData(1.0, 0.2)]
    [InlineData(1.7, 0.75)]
    public void Z_equals_the_Gutzwiller_factor(double n, double x)
    {
        double h = n / 2, a = Math.Sqrt((h - x) * (1 - n + x)) + Math.Sqrt((h - x) * x);
        Assert.Equal(a * a / (h * (1 - h)), FourBosonAmplitudes.At(n, x).Z, 1e-13);
        var amp = FourBosonAmplitudes.At(n, x);
        Assert.Equal(1.0, amp.E * amp.E + 2 * amp.P * amp.P + amp.D * amp.D, 1e-13); // completeness, KR Eq. 3
        Assert.Equal(n, amp.Filling, 1e-13);
    }

    // Away from half filling there is no transition: at U -> infinity d -> 0, e^2 = 1 - n, p^2 = n/2, so
    // z -> (1 - n)/(1 - n/2) (derived from the z above; the Gutzwiller result at n < 1, Vollhardt, Rev. Mod. Phys. 56,
    // 99 (1984), from memory). The correction is of order |e_kin|/U (d ~ |e_kin|/U), so U = 1e4 D is checked to 1e-3.
    [Theory]
    [InlineData(LatticeKind.FlatDos, 0.8)]
    [InlineData(LatticeKind.SemiEllipticDos, 0.5)]
    public void Large_U_away_from_half_filling_stays_metallic(LatticeKind dos, double n)
    {
        var s = FiniteUHubbardDos.Solve(dos, D, 1e4 * D, n);
        Assert.True(s.Converged);
        Assert.Equal((1 - n) / (1 - n / 2), s.Z, 1e-3);
    }

    [Fact]
    public void Bad_arguments_are_refused()
    {
        Assert.Throws<ArgumentException>(() => FiniteUHubbardDos.Solve(LatticeKind.FlatDos, D, -1, 1));
        Assert.Throws<ArgumentException>(() => FiniteUHubbardDos.Solve(LatticeKind.FlatDos, D, 1, 2.5));
        Assert.Throws<ArgumentException>(() => FiniteUHubbardDos.Solve(LatticeKind.SimpleCubic, D, 1, 1));
    }
}
