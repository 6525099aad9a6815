using System.Globalization;
using System.Text;
using Meanfield.Analysis;
using Meanfield.Analysis.Nodes;
using Meanfield.Units;

namespace Meanfield.Output;

/// <summary>
/// The terminal form of a node report: the Fermi level and how it was fixed, the gaps, then one paragraph per orbit of
/// nodes (energy against mu, kind, cone) with its members' positions and chiralities in words, then the totals and the
/// phase. Plain text, no colour; the same digest as the JSON report.
/// </summary>
public static class NodeReportText
{
    /// <summary>The report of <paramref name="digest"/> (with a node search) for <paramref name="solution"/>.</summary>
    /// <exception cref="ArgumentException">A digest without a node search.</exception>
    public static string Format(Solutions.Solution solution, SpectrumDigest digest)
    {
        var nodes = digest.Nodes ?? throw new ArgumentException("the digest holds no node search");
        var inv = CultureInfo.InvariantCulture;
        var u = solution.Model.Unit.Symbol();
        var sb = new StringBuilder();
        void Line(FormattableString s) => sb.AppendLine(s.ToString(inv));
        Line($"Fermi level     {digest.Mu:G10} {u} ({SolutionDocument.RuleName(solution.MuRule)}; {solution.OriginText})");
        Line($"bands           {nodes.OccupiedBands} filled; touchings of bands {nodes.OccupiedBands - 1} and {nodes.OccupiedBands} searched from a {nodes.Mesh} mesh");
        if (digest.Gaps is { } g) Line($"gaps            direct {g.Direct:G5} {u}, indirect {g.Indirect:G5} {u}");
        Line($"judged against  band-pair width {nodes.Tolerances.PairWidth:G4} {u}; pinned means within {nodes.Tolerances.Pinning:G3} {u} of mu");
        foreach (var orbit in nodes.Nodes.GroupBy(n => n.Orbit))
        {
            var first = orbit.First();
            double offset = orbit.Average(n => n.EnergyOffset);
            string where = first.Pinning switch { NodePinning.Pinned => "pinned at mu", NodePinning.Above => "above mu", _ => "below mu" };
            sb.AppendLine();
            string side = offset >= 0 ? "above" : "below";
            Line($"orbit {orbit.Key + 1}: {Count(orbit.Count(), first.IsDirac ? "Dirac node" : "Weyl node")} related by symmetry, {where} (their energy lies {Math.Abs(offset):G4} {u} {side} mu){(first.Location is { } l ? $", at {l}" : "")}");
            Line($"  each a {(first.Type == NodeType.TypeI ? "type-I" : "type-II")} cone with principal velocities {string.Join(", ", first.VelocitySingular.Select(v => v.ToString("G4", inv)))} {u} angstrom, tilt ratio {first.TiltRatio:F3} (a cone tips over at 1)");
            Line($"  where (reduced coordinates along b1, b2, b3) and with which chirality:");
            foreach (var n in orbit)
                Line($"    ({n.Reduced.X:F5}, {n.Reduced.Y:F5}, {n.Reduced.Z:F5})  {Chirality(n)}");
        }
        sb.AppendLine();
        string sum = nodes.ChiralitySum is { } s ? $"chiralities sum to {s}" : nodes.Dimension == 3 ? "chirality sum unknown (some undetermined)" : "no chirality in two dimensions";
        Line($"in all {Count(nodes.Nodes.Count, "node")}, {nodes.Nodes.Count(n => n.Pinning == NodePinning.Pinned)} pinned at mu; {sum}");
        Line($"phase: {digest.Phase!.Name} ({digest.Phase.Reason})");
        return sb.ToString();
    }

    private static string Count(int n, string noun) => n == 1 ? $"1 {noun}" : $"{n} {noun}s";

    private static string Chirality(WeylNode n) => n.Chirality switch
    {
        { } c when c > 0 => FormattableString.Invariant($"chirality +{c} (Berry flux {n.FluxOver2Pi:F4} x 2 pi)"),
        { } c when c < 0 => FormattableString.Invariant($"chirality {c} (Berry flux {n.FluxOver2Pi:F4} x 2 pi)"),
        { } => FormattableString.Invariant($"no net charge (Berry flux {n.FluxOver2Pi:F4} x 2 pi)"),
        null when n.FluxOver2Pi is { } f => FormattableString.Invariant($"chirality undetermined (Berry flux {f:F3} x 2 pi is not a whole multiple)"),
        null => n.SphereRadius == 0 ? "" : "chirality undetermined",
    };
}
