using System.Globalization;

namespace Meanfield.Heat;

/// <summary>
/// Reads measured heat capacity from a comma-separated file with a header row. Columns (names of our own):
/// <list type="bullet">
/// <item><c>T_K</c>: temperature in kelvin, positive, no repeats (rows may come in any order; they are sorted);</item>
/// <item>exactly one of <c>C_J_per_mol_K</c> (C in J mol^-1 K^-1) or <c>C_over_T_mJ_per_mol_K2</c>
/// (C/T in mJ mol^-1 K^-2), both per mole of formula units.</item>
/// </list>
/// Lines starting with '#' (after leading blanks) and blank lines are ignored. Any other column, a missing column, a
/// cell that is not a finite number, T &lt;= 0, a repeated T or fewer than 3 data rows raise <see cref="HeatDataError"/>
/// naming the file, line and column. The format is described in models/measured/README.md.
/// </summary>
public static class MeasuredHeatCsv
{
    public const string TemperatureColumn = "T_K";
    public const string HeatColumn = "C_J_per_mol_K";
    public const string COverTColumn = "C_over_T_mJ_per_mol_K2";
    public const int MinimumRows = 3;

    public static MeasuredHeat Load(string path)
    {
        string[] lines;
        try { lines = File.ReadAllLines(path); }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        { throw new HeatDataError(path, 0, "", $"cannot read the file: {ex.Message}"); }
        return Parse(lines, path);
    }

    /// <summary>Parses file lines; <paramref name="path"/> only labels errors.</summary>
    public static MeasuredHeat Parse(IReadOnlyList<string> lines, string path)
    {
        int headerLine = 0;
        string[]? header = null;
        var rows = new List<(double t, double c, int line)>();
        int tCol = -1, cCol = -1;
        bool cOverT = false;
        for (int n = 0; n < lines.Count; n++)
        {
            string text = lines[n].Trim();
            if (text.Length == 0 || text.StartsWith('#')) continue;
            string[] cells = text.Split(',').Select(c => c.Trim()).ToArray();
            int lineNo = n + 1;
            if (header is null)
            {
                header = cells;
                headerLine = lineNo;
                (tCol, cCol, cOverT) = ReadHeader(cells, path, lineNo);
                continue;
            }
            if (cells.Length > header.Length)
                throw new HeatDataError(path, lineNo, $"#{header.Length + 1}",
                    $"row has {cells.Length} cells but the header names {header.Length} columns");
            if (cells.Length < header.Length)
                throw new HeatDataError(path, lineNo, header[cells.Length],
                    $"missing cell: row has {cells.Length} of {header.Length} columns");
            double t = Number(cells[tCol], path, lineNo, header[tCol]);
            double v = Number(cells[cCol], path, lineNo, header[cCol]);
            if (!(t > 0)) throw new HeatDataError(path, lineNo, header[tCol], $"temperature {t} K must be positive");
            rows.Add((t, cOverT ? v * 1e-3 * t : v, lineNo));
        }
        if (header is null)
            throw new HeatDataError(path, 0, TemperatureColumn, "no header row: the file is empty or all comments");
        if (rows.Count < MinimumRows)
            throw new HeatDataError(path, headerLine, header[tCol],
                $"{rows.Count} data rows; at least {MinimumRows} are needed");
        rows.Sort((a, b) => a.t.CompareTo(b.t));
        for (int i = 1; i < rows.Count; i++)
            if (rows[i].t == rows[i - 1].t)
            {
                var (first, second) = rows[i].line > rows[i - 1].line ? (rows[i - 1], rows[i]) : (rows[i], rows[i - 1]);
                throw new HeatDataError(path, second.line, header[tCol],
                    $"temperature {second.t} K repeats the row on line {first.line}");
            }
        var curve = new HeatCurve(rows.Select(r => r.t).ToArray(), rows.Select(r => r.c).ToArray());
        return new MeasuredHeat(curve, path, rows.Select(r => r.line).ToArray());
    }

    private static (int t, int c, bool cOverT) ReadHeader(string[] cells, string path, int lineNo)
    {
        int t = -1, c = -1;
        bool cOverT = false;
        for (int i = 0; i < cells.Length; i++)
        {
            string name = cells[i];
            if (name == TemperatureColumn && t < 0) { t = i; continue; }
            if ((name == HeatColumn || name == COverTColumn) && c < 0) { c = i; cOverT = name == COverTColumn; continue; }
            string problem = name == TemperatureColumn || name == HeatColumn || name == COverTColumn
                ? (name == TemperatureColumn ? "appears twice" : $"only one of {HeatColumn} or {COverTColumn} may be given")
                : $"unknown column; expected {TemperatureColumn} and one of {HeatColumn} or {COverTColumn}";
            throw new HeatDataError(path, lineNo, name, problem);
        }
        if (t < 0) throw new HeatDataError(path, lineNo, TemperatureColumn, "missing column");
        if (c < 0) throw new HeatDataError(path, lineNo, HeatColumn, $"missing column: give {HeatColumn} or {COverTColumn}");
        return (t, c, cOverT);
    }

    private static double Number(string cell, string path, int lineNo, string column)
    {
        if (double.TryParse(cell, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) && double.IsFinite(v))
            return v;
        throw new HeatDataError(path, lineNo, column, $"'{cell}' is not a finite number");
    }
}
