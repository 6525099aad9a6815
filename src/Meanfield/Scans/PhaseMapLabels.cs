using System.Globalization;
using System.Text.RegularExpressions;
using Meanfield.Analysis;
using Meanfield.Models;

namespace Meanfield.Scans;

/// <summary>
/// The words a phase map is labelled with: readable phase names for the legend, axis names with units from the scan,
/// and the subtitle (model, temperature, mesh) read back from the scan file's own metadata.
/// </summary>
public static partial class PhaseMapLabels
{
    /// <summary>
    /// The axis title of a scan axis: a temperature axis in its own unit ("T (K)"); a model parameter in the model's
    /// energy unit ("V (meV)": model parameters are energies); a free variable named from the tie that uses it when the
    /// tie is a plain product ("m = ratio * lso" gives "m / lso"), else with that tie written out.
    /// </summary>
    /// <param name="axis">The scan axis.</param>
    /// <param name="grid">The grid, for its ties.</param>
    /// <param name="energyUnit">The model's energy unit symbol ("meV"); empty when unknown.</param>
    public static string AxisTitle(ScanAxis axis, ScanGrid grid, string energyUnit)
    {
        if (axis.IsTemperature) return Unit(axis.Name, axis.Unit);
        if (!axis.IsFreeVariable) return Unit(axis.Name, energyUnit);
        var uses = grid.Ties.Where(t => UsesName(t.Value, axis.Name)).ToList();
        if (uses.Count != 1) return axis.Name;
        var (tied, expr) = (uses[0].Key, uses[0].Value.Trim());
        if (expr == axis.Name) return tied;
        var product = ProductPattern().Match(expr);
        if (product.Success)
        {
            string a = product.Groups["a"].Value, b = product.Groups["b"].Value;
            if (a == axis.Name && b != axis.Name) return $"{tied} / {b}";
            if (b == axis.Name && a != axis.Name) return $"{tied} / {a}";
        }
        return $"{axis.Name}  ({tied} = {expr})";
    }

    /// <summary>
    /// "Orvathite, T = 2 K, mesh 10 per axis, shifted" from the scan file's metadata; parts that cannot be read
    /// are left out, never guessed. A temperature axis replaces the fixed temperature.
    /// </summary>
    public static string Subtitle(ScanTable table)
    {
        var parts = new List<string>();
        if (ModelName(table) is { } name) parts.Add(name);
        var grid = table.Grid;
        if (grid.FixedTemperatureK is double t && !grid.Axes.Any(a => a.IsTemperature))
            parts.Add(string.Create(CultureInfo.InvariantCulture, $"T = {t:0.###} K"));
        if (Solver(table) is { } solver) parts.Add(solver);
        if (table.Metadata.GetValueOrDefault(ScanMetadata.Shard) is { } shard && shard.Contains('/') && !shard.StartsWith("0/1", StringComparison.Ordinal))
            parts.Add($"shard {shard}");
        return string.Join(", ", parts);
    }

    private static string Unit(string name, string unit) => string.IsNullOrEmpty(unit) ? name : $"{name} ({unit})";

    private static bool UsesName(string expression, string name) =>
        Regex.IsMatch(expression, $@"(?<![\w.]){Regex.Escape(name)}(?![\w(])");

    [GeneratedRegex(@"^(?<a>[A-Za-z_]\w*)\s*\*\s*(?<b>[A-Za-z_]\w*)$")]
    private static partial Regex ProductPattern();

    private static string? ModelName(ScanTable table)
    {
        var text = table.Metadata.GetValueOrDefault(ScanMetadata.ModelText);
        if (string.IsNullOrEmpty(text)) return null;
        var root = Parse(text);
        var model = root?.Find("model")?.Value as TomlTable;
        return (model?.Find("name") ?? root?.Find("name"))?.Value is TomlScalar { Value: string s } && s.Length > 0 ? s : null;
    }

    private static string? Solver(ScanTable table)
    {
        var text = table.Metadata.GetValueOrDefault(ScanMetadata.ScanText);
        if (string.IsNullOrEmpty(text)) return null;
        if (Parse(text)?.Find("solver")?.Value is not TomlTable solver) return null;
        if (solver.Find("mesh")?.Value is not TomlScalar { Value: long mesh }) return null;
        bool shifted = solver.Find("shifted")?.Value is not TomlScalar { Value: false };
        return string.Create(CultureInfo.InvariantCulture, $"mesh {mesh} per axis{(shifted ? ", shifted" : "")}");
    }

    private static TomlTable? Parse(string text)
    {
        try { return TomlTreeBuilder.Build(text, "scan metadata"); }
        catch (Exception e) when (e is ModelError or FormatException or InvalidOperationException) { return null; }
    }
}
