using Meanfield.Scans;

namespace Meanfield.Tests.Scans;

internal static class ScanTestData
{
    public const string ModelText = "# invented model for scan tests\nname = \"toy\"\n";
    public const string ScanText = "# invented scan\n";

    public static ScanGrid Grid(int nv = 5, int nr = 4) => new(
        [
            new ScanAxis("V", ScanAxis.Linear(50, 300, nv), AxisSpacing.Linear),
            new ScanAxis("ratio", ScanAxis.Linear(0.1, 0.5, nr), AxisSpacing.Linear, IsFreeVariable: true),
        ],
        [new("lso", "20")], [new("m", "ratio * lso")], 2.0);

    public static ScanProvenance Provenance(string scanText = ScanText) => new(ModelText, scanText, "meV");

    /// <summary>Every column of a row except the wall time, as text, for run-to-run comparison.</summary>
    public static string Fingerprint(ScanTable table, ScanRow row) => string.Join("|",
        table.Schema.Columns.Where(c => c.Field.Name != "wall_seconds").Select(c => c.Field.Name + "=" + Format(c.Value(row))));

    private static string Format(object? v) => v switch
    {
        null => "null",
        double d => d.ToString("R", System.Globalization.CultureInfo.InvariantCulture),
        double[] a => string.Join(",", a),
        _ => v.ToString() ?? "",
    };
}
