using Meanfield.Renormalization;

namespace Meanfield.Solver;

/// <summary>
/// The average over the zone (a k-mesh) or over the conduction DOS (momentum-free lattices) that turns the mean-field
/// Hamiltonian at given amplitudes into a <see cref="StateTable"/>.
/// </summary>
public interface IStateSum
{
    /// <summary>Short description for provenance, for example "k-mesh 24x24x24 shifted".</summary>
    string Description { get; }
    int Groups { get; }
    /// <summary>Fills the table for the given amplitudes; the table is reused between calls (no allocation per call).</summary>
    StateTable Fill(MeanFieldAmplitudes amplitudes);

    /// <summary>
    /// Energies only, for mu and Omega_band (the decoupled branch); f weights and slopes may be left zero. Defaults to a
    /// full <see cref="Fill"/>.
    /// </summary>
    StateTable FillEnergies(MeanFieldAmplitudes amplitudes) => Fill(amplitudes);
}
