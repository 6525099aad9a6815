using System.CommandLine;
using Meanfield.Scans;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield map RESULT.parquet --x AXIS --y AXIS [--color phase|COLUMN] [--contour COLUMN] --out map.png`.</summary>
public static class MapCommand
{
    public static Command Build()
    {
        var input = new Argument<string>("RESULT") { Description = "Scan result (.parquet)" };
        var x = new Option<string>("--x") { Description = "Axis along x (a scan axis name)", Required = true };
        var y = new Option<string>("--y") { Description = "Axis along y (a scan axis name)", Required = true };
        var color = new Option<string>("--color") { Description = "Column that colours the cells: phase (default) or any numeric column such as r_f or direct_gap", DefaultValueFactory = _ => "phase" };
        var contour = new Option<string?>("--contour") { Description = "Numeric column drawn as contour lines (e.g. r_f)" };
        var levels = new Option<int>("--levels") { Description = "Number of contour levels", DefaultValueFactory = _ => 8 };
        var title = new Option<string?>("--title") { Description = "Plot title" };
        var output = new Option<string>("--out", "-o") { Description = "Picture file: " + Output.PlotStyle.PictureKinds, Required = true };
        var command = new Command("map", "Draw a scan result as a phase map over two of its axes") { input, x, y, color, contour, levels, title, output };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            var path = parse.GetValue(input)!;
            var png = parse.GetValue(output)!;
            if (!File.Exists(path)) throw new UserInputException($"{path}: scan result not found");
            var dir = Path.GetDirectoryName(Path.GetFullPath(png))!;
            if (!Directory.Exists(dir)) throw new UserInputException($"--out {png}: folder {dir} does not exist");
            Output.OutputGuard.Check(png, [path]);
            try
            {
                PhaseMap.Save(path, parse.GetValue(x)!, parse.GetValue(y)!, parse.GetValue(color)!, png,
                    new PhaseMapOptions { ContourColumn = parse.GetValue(contour), ContourLevels = parse.GetValue(levels), Title = parse.GetValue(title) });
            }
            catch (ScanError err)
            {
                parse.InvocationConfiguration.Error.WriteLine($"error: {err.Message}");
                return ExitCodes.BadInput;
            }
            o.WriteLine($"wrote {png}");
            return ExitCodes.Success;
        });
        return command;
    }
}
