using System.Globalization;
using Meanfield.Binding;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Models;

/// <summary>A plain-text description of a bound model (for "meanfield check"); the caller decides where it goes.</summary>
public static class ModelSummary
{
    public static IReadOnlyList<string> Describe(BoundModel model)
    {
        var ci = CultureInfo.InvariantCulture;
        string unit = model.Unit.Symbol();
        var lines = new List<string>
        {
            $"model: {model.Name}",
            model.IsMomentumFree
                ? string.Format(ci, "lattice: {0} (no momentum), half-width D = {1:G6} {2}", model.Lattice.Kind, model.DosHalfWidth, unit)
                : string.Format(ci, "lattice: {0}, a = {1:G6} angstrom, dimension {2}, cell volume {3:G6} angstrom^3",
                    model.Lattice.Kind, model.Lattice.Constant, model.Lattice.Dimension, model.Lattice.CellVolume),
            $"flavours: {model.Flavours}",
            string.Format(ci, "electrons per cell: {0:G6} of {1} states; formula units per cell: {2:G6}",
                model.ElectronsPerCell, model.StatesPerCell, model.FormulaUnitsPerCell),
            $"sites: {model.Sites.Count}",
        };
        for (int s = 0; s < model.Sites.Count; s++)
        {
            var site = model.Sites[s];
            var orbitals = model.Orbitals.Where(o => o.Site == s)
                .Select(o => o.Kind == OrbitalKind.Correlated ? $"{o.Name} (correlated)" : o.Name);
            lines.Add(string.Format(ci, "  {0} at ({1:G6}, {2:G6}, {3:G6}) angstrom: {4}", site.Name,
                site.Position.X, site.Position.Y, site.Position.Z, string.Join(", ", orbitals)));
        }
        lines.Add($"orbitals: {model.Orbitals.Count}");
        lines.Add($"shells: {model.Shells.Count} in {model.ShellGroups().Count} group(s)");
        foreach (var shell in model.Shells)
            lines.Add(shell.HasFiniteU
                ? string.Format(ci, "  {0}: N = {1}, U = {2:G6} {4} (four bosons), eps_f = {3:G6} {4}, group {5}",
                    model.Orbitals[shell.Orbital].Label(model.Sites), shell.Degeneracy, shell.U, shell.Level, unit, shell.Group)
                : string.Format(ci, "  {0}: N = {1}, Q = {2:G6}, eps_f = {3:G6} {4}, group {5}",
                    model.Orbitals[shell.Orbital].Label(model.Sites), shell.Degeneracy, shell.Constraint, shell.Level, unit, shell.Group));
        lines.Add($"parameters: {model.Parameters.Count}");
        foreach (var p in model.Parameters) lines.Add(string.Format(ci, "  {0} = {1:G6}", p.Key, p.Value));
        lines.Add($"bands: {model.BasisSize}");
        lines.Add("terms:");
        foreach (var (kind, count) in CountTerms(model)) lines.Add($"  {kind}: {count}");
        if (model.Solver is { } hints)
            lines.Add(string.Format(ci, "solver hints: temperature {0}, mesh {1}, shifted {2}, tolerance {3}, max iterations {4}",
                hints.TemperatureText ?? "-", hints.Mesh?.ToString(ci) ?? "-", (hints.Shifted is bool b ? (b ? "yes" : "no") : "-"),
                hints.Tolerance?.ToString("G3", ci) ?? "-", hints.MaxIterations?.ToString(ci) ?? "-"));
        return lines;
    }

    /// <summary>Stored bonds by kind (each also stands for its Hermitian conjugate) and on-site terms.</summary>
    private static List<(string, int)> CountTerms(BoundModel model)
    {
        int cc = 0, cf = 0, ff = 0;
        foreach (var h in model.Hoppings)
        {
            int corr = (model.Orbitals[h.From].Kind == OrbitalKind.Correlated ? 1 : 0) + (model.Orbitals[h.To].Kind == OrbitalKind.Correlated ? 1 : 0);
            if (corr == 0) cc++; else if (corr == 1) cf++; else ff++;
        }
        return
        [
            ("conduction bonds (h.c. implied)", cc), ("hybridization bonds (h.c. implied)", cf),
            ("shell-shell bonds (h.c. implied)", ff), ("on-site terms", model.Onsite.Count),
        ];
    }
}
