using Meanfield.Units;

namespace Meanfield.Tests.Heat;

public class ConstantsTests
{
    // Exact SI values: Tiesinga, Mohr, Newell & Taylor, "CODATA recommended values of the fundamental physical
    // constants: 2018", Rev. Mod. Phys. 93, 025010 (2021), Table I (defining constants).
    [Fact]
    public void DefiningConstantsAreTheCodata2018ExactValues()
    {
        Assert.Equal(6.62607015e-34, PhysicalConstants.Planck);
        Assert.Equal(1.602176634e-19, PhysicalConstants.ElementaryCharge);
        Assert.Equal(1.380649e-23, PhysicalConstants.Boltzmann);
        Assert.Equal(6.02214076e23, PhysicalConstants.Avogadro);
        Assert.Equal(6.62607015e-34 / (2 * Math.PI), PhysicalConstants.HBar, 1e-46);
    }

    // Derived values quoted by the same CODATA 2018 adjustment (Tiesinga et al. 2021, Table XXXI):
    // R = 8.314 462 618... J mol^-1 K^-1; hbar = 1.054 571 817... e-34 J s; 1 eV / k_B = 11 604.518 12... K.
    [Fact]
    public void DerivedConstantsMatchPublishedCodataValues()
    {
        Assert.Equal(8.314462618, PhysicalConstants.GasConstant, 1e-9);
        Assert.Equal(1.054571817e-34, PhysicalConstants.HBar, 1e-43);
        Assert.Equal(11604.51812, EnergyUnit.ElectronVolt.Kelvins(), 1e-5);
        Assert.Equal(11.60451812, EnergyUnit.MilliElectronVolt.Kelvins(), 1e-8);
        Assert.Equal(1.0, EnergyUnit.Kelvin.Kelvins(), 1e-15);
    }
}
