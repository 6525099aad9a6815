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
/// The JSON report of `meanfield nodes`, grouped by orbit (nodes that a lattice operation maps onto each other at one
/// energy): per orbit its energy, offset from mu and pinning, and per member its position (reduced and Cartesian,
/// 1/angstrom), location, chirality (null when undetermined) with the Berry flux behind it, and its cone (velocity
/// tensor in energy unit x angstrom, tilt, type); then the totals, the tolerances judged by, the gaps, the DOS at mu and
/// the phase label: all from the one spectrum digest. No number is written as NaN.
/// </summary>
public static class NodeReportJson
{
    public const string FormatTag = "meanfield-nodes/2";

    /// <summary>The report of <paramref name="digest"/> (which must hold a node search and gaps) for <paramref name="solution"/>.</summary>
    /// <exception cref="ArgumentException">A digest without a node search.</exception>
    public static string Build(Solutions.Solution solution, SpectrumDigest digest, IReadOnlyDictionary<string, string> provenance)
    {
        var nodes = digest.Nodes ?? throw new ArgumentException("the digest holds no node search");
        var gaps = digest.Gaps!;
        var unit = solution.Model.Unit;
        var lattice = solution.Model.Lattice;
        using var ms = new MemoryStream();
        using (var w = new Utf8JsonWriter(ms, new JsonWriterOptions { Indented = true }))
        {
            w.WriteStartObject();
            w.WriteString("format", FormatTag);
            foreach (var (k, v) in provenance) w.WriteString(k, v);
            w.WriteString("energy_unit", unit.Symbol());
            w.WriteString("k_unit", "1/angstrom");
            w.WriteString("velocity_unit", $"{unit.Symbol()} angstrom");
            Num(w, "chemical_potential", digest.Mu);
            w.WriteString("mu_rule", SolutionDocument.RuleName(solution.MuRule));
            Num(w, "temperature", solution.Temperature);
            w.WriteNumber("occupied_bands", nodes.OccupiedBands);
            w.WriteString("search_mesh", nodes.Mesh);
            w.WriteStartObject("phase");
            w.WriteString("label", digest.Phase!.Name);
            w.WriteString("reason", digest.Phase.Reason);
            w.WriteEndObject();
            w.WriteStartObject("totals");
            w.WriteNumber("nodes", nodes.Nodes.Count);
            w.WriteNumber("pinned_at_mu", nodes.Nodes.Count(n => n.Pinning == NodePinning.Pinned));
            w.WriteBoolean("chiralities_resolved", nodes.ChiralitiesResolved);
            if (nodes.ChiralitySum is { } sum) w.WriteNumber("chirality_sum", sum); else w.WriteNull("chirality_sum");
            w.WriteBoolean("nodal_line_suspected", nodes.NodalLineSuspected);
            w.WriteBoolean("fermi_surface_away_from_nodes", nodes.FermiSurfaceAwayFromNodes);
            Num(w, "band_overlap", nodes.BandOverlap);
            Num(w, "node_energy_spread", nodes.NodeEnergySpread);
            w.WriteEndObject();
            w.WriteStartObject("judged_by");
            Num(w, "band_pair_width", nodes.Tolerances.PairWidth);
            Num(w, "pinning_window", nodes.Tolerances.Pinning);
            Num(w, "node_gap_target", nodes.Tolerances.NodeGap);
            Num(w, "gap_threshold", nodes.Tolerances.Gap);
            Num(w, "merge_distance", nodes.Tolerances.Merge);
            w.WriteEndObject();
            w.WriteStartArray("orbits");
            foreach (var orbit in nodes.Nodes.GroupBy(n => n.Orbit))
            {
                var first = orbit.First();
                w.WriteStartObject();
                w.WriteNumber("orbit", orbit.Key);
                w.WriteNumber("members_count", orbit.Count());
                Num(w, "energy", orbit.Average(n => n.Energy));
                Num(w, "energy_minus_mu", orbit.Average(n => n.EnergyOffset));
                w.WriteString("position_against_mu", first.Pinning switch { NodePinning.Pinned => "pinned", NodePinning.Above => "above", _ => "below" });
                w.WriteString("kind", first.IsDirac ? "dirac" : "weyl");
                w.WriteStartArray("members");
                foreach (var n in orbit) Node(w, n);
                w.WriteEndArray();
                w.WriteEndObject();
            }
            w.WriteEndArray();
            w.WriteStartArray("warnings");
            foreach (var s in nodes.Warnings) w.WriteStringValue(s);
            w.WriteEndArray();
            w.WriteStartObject("gaps");
            Num(w, "direct", gaps.Direct);
            Vector(w, "direct_at_reduced", lattice.Reduced(gaps.DirectAt));
            Num(w, "indirect", gaps.Indirect);
            Num(w, "valence_maximum", gaps.ValenceMaximum);
            Num(w, "conduction_minimum", gaps.ConductionMinimum);
            w.WriteString("mesh", gaps.Mesh);
            w.WriteEndObject();
            if (digest.DosAtMu is { } dos)
            {
                w.WriteStartObject("dos_at_mu");
                w.WriteString("unit", $"states per {unit.Symbol()} per cell");
                Num(w, "total", dos.Total);
                Num(w, "correlated", dos.Correlated);
                Num(w, "conduction", dos.Conduction);
                w.WriteEndObject();
            }
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
        if (n.Chirality is { } c) w.WriteNumber("chirality", c); else w.WriteNull("chirality");
        if (n.FluxOver2Pi is { } f) Num(w, "berry_flux_over_2pi", f); else w.WriteNull("berry_flux_over_2pi");
        Num(w, "sphere_radius", n.SphereRadius);
        w.WriteNumber("bands_touching", n.Degeneracy);
        w.WriteStartObject("cone");
        w.WriteStartArray("velocity_tensor");
        for (int i = 0; i < 3; i++)
        {
            w.WriteStartArray();
            for (int j = 0; j < 3; j++) NumValue(w, n.Velocity[i, j]);
            w.WriteEndArray();
        }
        w.WriteEndArray();
        w.WriteStartArray("principal_velocities");
        foreach (var s in n.VelocitySingular) NumValue(w, s);
        w.WriteEndArray();
        Num(w, "velocity_determinant_magnitude", n.DetVelocity);
        Vector(w, "tilt", n.Tilt);
        Num(w, "tilt_ratio", n.TiltRatio);
        w.WriteString("type", n.Type == NodeType.TypeI ? "I" : "II");
        w.WriteEndObject();
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
