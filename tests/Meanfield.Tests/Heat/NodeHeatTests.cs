using Meanfield.Heat;
using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class NodeHeatTests
{
    // Per node C/V = (7 pi^2/30) k_B^4 T^3 / (hbar^3 v^3) (derived in NodeHeat's remarks; Ashcroft & Mermin, Solid State Physics (1976), app. C for the integral), written
    // here directly in SI with CODATA 2018 constants and the molar volume V_m = V_cell N_A / Z: an independent route
    // through the unit conversions of NodeHeat.MolarBeta and VelocityFromBeta.
    [Fact]
    public void MolarBetaAndVelocityInversionAgreeWithSiFormula()
    {
        double hbarVmeVA = 40, volumeA3 = 250, z = 2; int nodes = 4;
        double hbarVSi = hbarVmeVA * 1e-3 * PhysicalConstants.ElementaryCharge * 1e-10; // J m
        double vm = volumeA3 * 1e-30 * PhysicalConstants.Avogadro / z;                  // m^3 per mol of formula units
        double kB = PhysicalConstants.Boltzmann;
        double betaSi = nodes * 7 * Math.PI * Math.PI / 30 * Math.Pow(kB, 4) / Math.Pow(hbarVSi, 3) * vm;
        var node = new NodeHeat(EnergyUnit.MilliElectronVolt, volumeA3, z);
        Assert.Equal(betaSi, node.MolarBeta(Math.Pow(hbarVmeVA, 3), nodes), betaSi * 1e-12);

        var v = node.VelocityFromBeta(betaSi, 0.06 * betaSi, nodes);
        Assert.Equal(hbarVmeVA, v.HbarV, 1e-9);
        Assert.Equal(hbarVSi / PhysicalConstants.HBar, v.MetresPerSecond, 1e-6);
        Assert.Equal(0.02 * hbarVmeVA, v.HbarVError, 1e-9); // sigma_v/v = sigma_beta/(3 beta)
        // Order of magnitude: 40 meV A is about 6.1 km/s (hbar = 6.582e-13 meV s).
        Assert.InRange(v.MetresPerSecond, 6000, 6200);
    }

    // Anisotropic cone: v^3 -> |det v_ij| (common practice: q' = v q maps it onto the isotropic cone); a diagonal tensor with a rotation keeps |det| = v1 v2 v3.
    [Fact]
    public void AnisotropicConeUsesDeterminant()
    {
        double c = Math.Cos(0.3), s = Math.Sin(0.3);
        double[,] rot = { { c, -s, 0 }, { s, c, 0 }, { 0, 0, 1 } };
        double[] d = [20, 30, -50];
        var v = new double[3, 3];
        for (int i = 0; i < 3; i++) for (int j = 0; j < 3; j++) v[i, j] = rot[i, j] * d[j];
        Assert.Equal(30000, NodeHeat.Determinant(v), 1e-8);
        var node = new NodeHeat(EnergyUnit.MilliElectronVolt, 100);
        // Stretching one axis of the cone by 2 halves the DOS and so the T^3 coefficient.
        var stretched = (double[,])v.Clone();
        for (int i = 0; i < 3; i++) stretched[i, 2] *= 2;
        double beta = node.MolarBeta(NodeHeat.Determinant(v));
        Assert.Equal(beta / 2, node.MolarBeta(NodeHeat.Determinant(stretched)), beta * 1e-12);
    }

    [Fact]
    public void NonPositiveBetaCannotGiveAVelocity()
    {
        var node = new NodeHeat(EnergyUnit.MilliElectronVolt, 100);
        Assert.Throws<ArgumentException>(() => node.VelocityFromBeta(-1e-4, 1e-5, 2));
    }
}
