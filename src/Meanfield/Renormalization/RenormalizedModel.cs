using Meanfield.Binding;

namespace Meanfield.Renormalization;

/// <summary>
/// Folds a mean-field solution into an ordinary one-body model: every bond with a correlated end is multiplied by the
/// boson amplitudes of its ends (r for a hybridization, r_i r_j for f-f hopping), and every shell level becomes
/// eps_f + lambda. The bare Bloch Hamiltonian of the result is H_MF(k); other codes can take it as a plain
/// tight-binding model of the heavy quasiparticles.
/// </summary>
public static class RenormalizedModel
{
    public static BoundModel Build(BoundModel model, MeanFieldAmplitudes amplitudes)
    {
        var groups = model.ShellGroups();
        var scale = new double[model.Orbitals.Count];
        Array.Fill(scale, 1.0);
        var shells = new List<CorrelatedShell>();
        foreach (var s in model.Shells)
        {
            int g = IndexOf(groups, s.Group);
            scale[s.Orbital] = amplitudes.R[g];
            shells.Add(s with { Level = s.Level + amplitudes.Lambda[g] });
        }
        var hoppings = model.Hoppings
            .Select(h => h with { Amplitude = h.Amplitude.Scale(scale[h.From] * scale[h.To]) })
            .ToList();
        return model.With(hoppings: hoppings, shells: shells, name: model.Name + " (renormalized)");
    }

    private static int IndexOf(IReadOnlyList<string> list, string value)
    {
        for (int i = 0; i < list.Count; i++) if (list[i] == value) return i;
        throw new ArgumentException($"unknown shell group '{value}'");
    }
}
