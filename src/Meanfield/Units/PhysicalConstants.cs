namespace Meanfield.Units;

/// <summary>CODATA 2018 exact SI values (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)).</summary>
public static class PhysicalConstants
{
    /// <summary>Planck constant h in J s.</summary>
    public const double Planck = 6.62607015e-34;
    /// <summary>Reduced Planck constant hbar = h / (2 pi) in J s.</summary>
    public const double HBar = Planck / (2 * Math.PI);
    /// <summary>Elementary charge e in C (also J per eV).</summary>
    public const double ElementaryCharge = 1.602176634e-19;
    /// <summary>Boltzmann constant k_B in J/K.</summary>
    public const double Boltzmann = 1.380649e-23;
    /// <summary>Avogadro constant N_A in 1/mol.</summary>
    public const double Avogadro = 6.02214076e23;
    /// <summary>Molar gas constant R = N_A k_B in J/(mol K).</summary>
    public const double GasConstant = Avogadro * Boltzmann;
    /// <summary>Boltzmann constant in meV/K.</summary>
    public const double BoltzmannMeVPerKelvin = Boltzmann / ElementaryCharge * 1e3;
}
