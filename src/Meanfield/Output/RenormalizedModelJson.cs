using System.Text.Json;
using System.Text.Json.Nodes;
using Meanfield.Binding;
using Meanfield.Bloch;
using Meanfield.Lattices;

namespace Meanfield.Output;

/// <summary>
/// JSON form of a (renormalized) one-body model for other codes: lattice vectors and sites in angstrom, the basis
/// order (orbital x flavour), every bond as its F x F matrix (h.c. implied), on-site matrices and shell levels, mu,
/// and the energy unit. Bloch convention II: H_ij(k) += t e^{ik.(R + tau_j - tau_i)}.
/// </summary>
public static class RenormalizedModelJson
{
    public static string Write(BoundModel model, double mu, string comment)
    {
        static JsonArray Vec(Vec3 v) => [v.X, v.Y, v.Z];
        static JsonArray Matrix(FlavourMatrix m)
        {
            var rows = new JsonArray();
            for (int a = 0; a < m.Flavours; a++)
            {
                var row = new JsonArray();
                for (int b = 0; b < m.Flavours; b++) row.Add(new JsonArray(m[a, b].Real, m[a, b].Imaginary));
                rows.Add(row);
            }
            return rows;
        }
        var root = new JsonObject
        {
            ["format"] = "meanfield-renormalized-model/1",
            ["comment"] = comment,
            ["energy_unit"] = Units.EnergyUnits.Symbol(model.Unit),
            ["length_unit"] = "angstrom",
            ["bloch_convention"] = "H_ij(k) += t exp(i k.(R + tau_j - tau_i)); hermitian conjugate of every bond implied",
            ["chemical_potential"] = mu,
            ["electrons_per_cell"] = model.ElectronsPerCell,
            ["flavours"] = model.Flavours,
            ["lattice_vectors"] = new JsonArray(Vec(model.Lattice.A1), Vec(model.Lattice.A2), Vec(model.Lattice.A3)),
            ["sites"] = new JsonArray([.. model.Sites.Select(s => (JsonNode)new JsonObject { ["name"] = s.Name, ["position"] = Vec(s.Position) })]),
            ["orbitals"] = new JsonArray([.. model.Orbitals.Select((o, i) => (JsonNode)new JsonObject
            {
                ["index"] = i, ["name"] = o.Name, ["site"] = model.Sites[o.Site].Name,
                ["kind"] = o.Kind == OrbitalKind.Correlated ? "correlated" : "conduction",
                ["first_basis_index"] = i * model.Flavours,
            })]),
            ["levels"] = new JsonArray([.. model.Shells.Select(s => (JsonNode)new JsonObject { ["orbital"] = s.Orbital, ["level"] = s.Level })]),
            ["onsite"] = new JsonArray([.. model.Onsite.Select(o => (JsonNode)new JsonObject { ["orbital"] = o.Orbital, ["matrix"] = Matrix(o.Amplitude) })]),
            ["bonds"] = new JsonArray([.. model.Hoppings.Select(h => (JsonNode)new JsonObject
            {
                ["from"] = h.From, ["to"] = h.To, ["cell"] = new JsonArray(h.R.N1, h.R.N2, h.R.N3), ["matrix"] = Matrix(h.Amplitude),
            })]),
        };
        return root.ToJsonString(new JsonSerializerOptions { WriteIndented = true }) + "\n";
    }
}
