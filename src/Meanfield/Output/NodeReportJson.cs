using System.Text;
using System.Text.Json;
using Meanfield.Analysis;
using Meanfield.Analysis.Dos;
using Meanfield.Analysis.Gaps;
using Meanfield.Analysis.Nodes;
using Meanfield.Lattices;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// The JSON report of `meanfield nodes`: every touching of bands n_occ - 1 and n_occ with its position (reduced and
/// Cartesian, 1/angstrom), energy minus mu, chirality and raw Berry flux over 2 pi, cone velocity tensor (energy unit
/// x angstrom), tilt and type; the chirality sum, the gap report, the Fermi-level DOS and the phase label.
/// Non-finite numbers are written as null.
/// </summary>
public static class NodeReportJson
{
    public const string FormatTag = "meanfield-nodes/1";

    public static string Build(NodeSearchResult nodes, GapReport gaps, DosValue dosFermi, double formulaUnits, PhaseLabel phase,
                               Lattice lattice, EnergyUnit unit, IReadOnlyDictionary<string, string> provenance)
    {
        using var ms = new MemoryStream();
        using (var w = new Utf8JsonWriter(ms, new JsonWriterOptions { Indented = true }))
        {
            w.WriteStartObject();
            w.WriteString("format", FormatTag);
            foreach (var (k, v) in provenance) w.WriteString(k, v);
            w.WriteString("energy_unit", unit.Symbol());
            w.WriteString("k_unit", "1/angstrom");
            w.WriteString("velocity_unit", $"{unit.Symbol()} angstrom");
            Num(w, "chemical_potential", nodes.ChemicalPotential);
            w.WriteNumber("occupied_bands", nodes.OccupiedBands);
            w.WriteString("search_mesh", nodes.Mesh);
            w.WriteStartObject("phase");
            w.WriteString("label", SpectrumSummary.Name(phase.Phase));
            w.WriteString("reason", phase.Reason);
            w.WriteEndObject();
            w.WriteNumber("node_count", nodes.Nodes.Count);
            w.WriteNumber("chirality_sum", nodes.ChiralitySum);
            w.WriteBoolean("nodal_line_suspected", nodes.NodalLineSuspected);
            w.WriteStartArray("nodes");
            foreach (var n in nodes.Nodes) Node(w, n);
            w.WriteEndArray();
            w.WriteStartArray("warnings");
            foreach (var s in nodes.Warnings) w.WriteStringValue(s);
            w.WriteEndArray();
            w.WriteStartObject("gaps");
            Num(w, "direct", gaps.Direct);
            Vector(w, "direct_at_reduced", lattice.Reduced(gaps.DirectAt));
            Num(w, "indirect", gaps.Indirect);
            Num(w, "valence_maximum", gaps.ValenceMaximum);
            Vector(w, "valence_maximum_at_reduced", lattice.Reduced(gaps.ValenceMaximumAt));
            Num(w, "conduction_minimum", gaps.ConductionMinimum);
            Vector(w, "conduction_minimum_at_reduced", lattice.Reduced(gaps.ConductionMinimumAt));
            w.WriteString("mesh", gaps.Mesh);
            w.WriteEndObject();
            w.WriteStartObject("dos_fermi");
            w.WriteString("unit", $"states per {unit.Symbol()}");
            Num(w, "total_per_cell", dosFermi.Total);
            Num(w, "correlated_per_cell", dosFermi.Correlated);
            Num(w, "conduction_per_cell", dosFermi.Conduction);
            Num(w, "total_per_formula_unit", dosFermi.Total / formulaUnits);
            Num(w, "correlated_per_formula_unit", dosFermi.Correlated / formulaUnits);
            w.WriteEndObject();
            w.WriteEndObject();
        }
        return Encoding.UTF8.GetString(ms.ToArray());
    }

    private static void Node(Utf8JsonWriter w, WeylNode n)
    {
        w.WriteStartObject();
        Vector(w, "reduced", n.Reduced);
        Vector(w, "cartesian", n.Cartesian);
        if (n.Location is null) w.WriteNull("location"); else w.WriteString("location", n.Location);
        Num(w, "energy_minus_mu", n.EnergyOffset);
        Num(w, "residual_gap", n.Gap);
        w.WriteNumber("chirality", n.Chirality);
        Num(w, "flux_over_2pi", n.FluxOver2Pi);
        w.WriteString("degeneracy", n.IsDirac ? "dirac" : "weyl");
        w.WriteNumber("bands_touching", n.Degeneracy);
        w.WriteStartArray("velocity_tensor");
        for (int i = 0; i < 3; i++)
        {
            w.WriteStartArray();
            for (int j = 0; j < 3; j++) NumValue(w, n.Velocity[i, j]);
            w.WriteEndArray();
        }
        w.WriteEndArray();
        w.WriteStartArray("velocity_singular_values");
        foreach (var s in n.VelocitySingular) NumValue(w, s);
        w.WriteEndArray();
        Num(w, "abs_det_velocity", n.DetVelocity);
        Vector(w, "tilt", n.Tilt);
        Num(w, "tilt_ratio", n.TiltRatio);
        w.WriteString("type", n.Type == NodeType.TypeI ? "I" : "II");
        w.WriteEndObject();
    }

    private static void Vector(Utf8JsonWriter w, string name, Vec3 v)
    {
        w.WriteStartArray(name);
        NumValue(w, v.X); NumValue(w, v.Y); NumValue(w, v.Z);
        w.WriteEndArray();
    }

    private static void Num(Utf8JsonWriter w, string name, double v)
    {
        if (double.IsFinite(v)) w.WriteNumber(name, v); else w.WriteNull(name);
    }

    private static void NumValue(Utf8JsonWriter w, double v)
    {
        if (double.IsFinite(v)) w.WriteNumberValue(v); else w.WriteNullValue();
    }
}
