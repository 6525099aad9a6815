using System.Globalization;
using Meanfield.Solutions;

namespace Meanfield.Output;

/// <summary>
/// The provenance every result table of an analysis carries (bands, DOS, curvature, heat), as in scans: the model, a
/// `source` that is a file that exists (the solution file, exported model or model file read), the model text and its
/// hash, the parameter values, mu and how it was fixed, the temperature, the tool version and the time.
/// </summary>
public static class ResultProvenance
{
    /// <summary>The full path of the file <paramref name="solution"/> was read from (the model file when solved on the fly or bare).</summary>
    public static string SourceFile(Solution solution)
    {
        var path = solution.SourcePath is { Length: > 0 } p ? p : solution.Model.SourcePath;
        return string.IsNullOrEmpty(path) ? "" : Path.GetFullPath(path);
    }

    /// <summary>The provenance pairs of <paramref name="solution"/>, in file order.</summary>
    public static IReadOnlyList<KeyValuePair<string, string>> Of(Solution solution)
    {
        var inv = CultureInfo.InvariantCulture;
        var m = solution.Model;
        string u = Units.EnergyUnits.Symbol(m.Unit);
        var kind = solution.Origin switch
        {
            SolutionOrigin.File => "solution file",
            SolutionOrigin.ExportedModel => "exported model",
            SolutionOrigin.BareModel => "model file, bare",
            _ => "model file, solved on the fly",
        };
        var pairs = new List<KeyValuePair<string, string>>
        {
            new("model", m.Name),
            new("source", SourceFile(solution)),
            new("source_kind", kind),
            new("model_path", string.IsNullOrEmpty(m.SourcePath) ? "" : Path.GetFullPath(m.SourcePath)),
            new("model_sha256", Provenance.Hash(m.SourceText)),
            new("parameters", string.Join(", ", m.Parameters.Select(p => $"{p.Key} = {p.Value.ToString("R", inv)}"))),
            new($"chemical_potential_{u}", solution.Mu.ToString("R", inv)),
            new("chemical_potential_rule", SolutionDocument.RuleName(solution.MuRule)),
            new($"temperature_{u}", solution.Temperature.ToString("R", inv)),
            new("tool_version", Provenance.ToolVersion),
            new("created", Provenance.NowUtc()),
        };
        // The model text itself, as scans carry it (an exported model's text is the file named by source; it names
        // what it was exported from).
        if (solution.ExportHeader is { } h)
        {
            pairs.Add(new("exported_from", h.Source));
            pairs.Add(new("exported_from_model_path", h.ModelPath));
            pairs.Add(new("exported_from_model_sha256", h.ModelSha256));
        }
        else pairs.Add(new("model_text", m.SourceText));
        return pairs;
    }
}
