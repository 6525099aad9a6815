using System.CommandLine;
using System.Globalization;
using Meanfield.Binding;
using Meanfield.Models;
using Meanfield.Solver;
using Meanfield.Units;

namespace Meanfield.Cli;

/// <summary>Arguments and options shared by several commands, and the code that turns them into library inputs.</summary>
public static class CommonOptions
{
    public static Argument<string> ModelArgument() => new("MODEL") { Description = "Model file (.toml)" };

    public static Argument<string> InputArgument() =>
        new("INPUT") { Description = "A solution file (.json from `solve`) or a model file (.toml, solved on the fly)" };

    public static Option<string[]> Set() => new("--set")
    {
        Description = "Override a parameter: NAME=VALUE (VALUE may be an expression); repeatable",
        AllowMultipleArgumentsPerToken = false,
    };

    public static Option<string?> Temperature() =>
        new("--temperature", "-T") { Description = "Temperature: a number in the model's energy unit, or with a unit: 2K, 0.3meV" };

    public static Option<int?> Mesh() => new("--mesh") { Description = "k-mesh divisions per reciprocal axis (default: model's [solver] or 16)" };

    public static Option<double?> Tolerance() => new("--tolerance") { Description = "Convergence tolerance of the saddle point, relative to the model's largest energy (default: model's [solver] or 1e-10)" };
    public static Option<int?> MaxIterations() => new("--max-iterations") { Description = "Most saddle-point iterations (default: model's [solver] or 100)" };
    public static Option<bool> Bare() => new("--bare") { Description = "Use the bare model: f levels and hybridization unrenormalized" };

    public static Option<string> Out(bool required = true) => new("--out", "-o") { Description = "Output file", Required = required };

    /// <summary>
    /// Checks a table's --out: .csv or .parquet by extension, or "-" for CSV on standard output. Returns true for "-":
    /// then no picture is drawn and the command's messages go to standard error, so the table can be piped.
    /// </summary>
    /// <exception cref="UserInputException">Another extension.</exception>
    public static bool CheckTableOut(string outPath)
    {
        if (Output.AtomicFile.IsStandardOutput(outPath)) return true;
        if (Path.GetExtension(outPath).ToLowerInvariant() is not (".csv" or ".parquet"))
            throw new UserInputException($"--out {outPath}: use a .csv or .parquet file name, or - for CSV on standard output");
        return false;
    }

    /// <summary>"wrote F.csv and F.png", or "wrote the table to standard output" for --out -.</summary>
    public static string Wrote(string outPath, string? picture) =>
        Output.AtomicFile.IsStandardOutput(outPath) ? "wrote the table to standard output" : picture is null ? $"wrote {outPath}" : $"wrote {outPath} and {picture}";

    /// <summary>The picture drawn beside a table (.png), or null when the table goes to standard output.</summary>
    public static string? PictureBeside(string outPath) =>
        Output.AtomicFile.IsStandardOutput(outPath) ? null : Path.ChangeExtension(outPath, ".png");

    /// <summary>Where a command's messages go: standard error when its data goes to standard output (--out -).</summary>
    public static TextWriter Messages(ParseResult parse, string outPath) =>
        Output.AtomicFile.IsStandardOutput(outPath) ? parse.InvocationConfiguration.Error : parse.InvocationConfiguration.Output;

    public static Dictionary<string, string> ParseSets(string[]? sets)
    {
        var result = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var s in sets ?? [])
        {
            int eq = s.IndexOf('=');
            if (eq <= 0 || eq == s.Length - 1) throw new UserInputException($"--set '{s}': expected NAME=VALUE");
            result[s[..eq].Trim()] = s[(eq + 1)..].Trim();
        }
        return result;
    }

    /// <summary>
    /// Refuses <paramref name="outputs"/> that are folders, lie in missing folders or resolve to an input (INPUT, the
    /// model a solution file names, and <paramref name="others"/>): exit 2 before anything is computed or touched.
    /// </summary>
    public static void RefuseOverwrite(string input, IReadOnlyList<string> outputs, params string?[] others)
    {
        var inputs = new List<string?>(others) { input };
        if (input.EndsWith(".json", StringComparison.OrdinalIgnoreCase)) inputs.Add(Output.SolutionDocument.PeekModelPath(input));
        Output.OutputGuard.Check(outputs, inputs);
    }

    /// <summary>A model file bound with <paramref name="overrides"/>, or an exported one-body model (which takes none).</summary>
    public static BoundModel LoadModel(string path, IReadOnlyDictionary<string, string>? overrides)
    {
        if (!File.Exists(path)) throw new UserInputException($"{path}: model file not found");
        if (Solutions.SolutionInput.Recognise(path) == Solutions.InputKind.ExportedModel)
        {
            if (Solutions.SolutionInput.RefusedForExport(path, overrides is { Count: > 0 }, false, false) is { } refusal) throw new UserInputException(refusal);
            return Output.OneBodyModelFiles.Load(path).Model;
        }
        return ModelBinder.Bind(ModelFile.Load(path), overrides);
    }

    /// <summary>"2K", "2 K", "0.3meV", "1e-3 eV" or a bare number (the model's energy unit) to the model's energy unit.</summary>
    public static double ParseTemperature(string text, EnergyUnit unit, string option = "--temperature")
    {
        double inUnit = ParseEnergy(text, unit, option);
        if (!(inUnit >= 0) || !double.IsFinite(inUnit)) throw new UserInputException($"{option} '{text}': temperature must be a finite number >= 0");
        if (inUnit > PhysicalRange.MaxEnergy(unit))
            throw new UserInputException($"{option} '{text}': beyond the physical range (at most {PhysicalRange.MaxEnergyText(unit)})");
        return inUnit;
    }

    /// <summary>
    /// --window E1 E2: an energy window relative to mu, two energies read by the one energy grammar (bare numbers in the
    /// model's unit, or with a unit: -20meV); with <paramref name="allowAll"/> the single word "all" as well.
    /// </summary>
    public static Option<string[]> Window(string description, bool required = false, bool allowAll = false) => new("--window")
    {
        Description = description, Required = required,
        Arity = new ArgumentArity(allowAll ? 1 : 2, 2), AllowMultipleArgumentsPerToken = true,
    };

    /// <summary>The window of <see cref="Window"/> in the model's unit, relative to mu; null when not given (or "all", when <paramref name="allowAll"/>).</summary>
    /// <exception cref="UserInputException">Not two energies E1 &lt; E2 (or "all" where allowed).</exception>
    public static (double Low, double High)? ParseWindow(string[]? given, EnergyUnit unit, bool allowAll = false, string option = "--window") =>
        Pair(given, allowAll ? "all" : null, t => ParseEnergy(t, unit, option), option, "two energies E1 < E2 relative to mu (such as -20 20, or -20meV 20meV)");

    /// <summary>Two temperatures T1 &lt; T2 (0.1K 2K; bare numbers in the model's unit), in the model's unit; null when not given or "auto".</summary>
    /// <exception cref="UserInputException">Not two temperatures T1 &lt; T2 (or "auto").</exception>
    public static (double Low, double High)? ParseTemperatureWindow(string[]? given, EnergyUnit unit, string option) =>
        Pair(given, "auto", t => ParseTemperature(t, unit, option), option, "two temperatures T1 < T2 (such as 0.1K 2K)");

    // Two values read by one parser, ascending; nothing or the one keyword means "not given".
    private static (double Low, double High)? Pair(string[]? given, string? keyword, Func<string, double> read, string option, string expected)
    {
        if (given is null or [] || (keyword is not null && given is [var only] && only == keyword)) return null;
        if (given is [var a, var b] && read(a) is var lo && read(b) is var hi && hi > lo) return (lo, hi);
        throw new UserInputException($"{option} {string.Join(" ", given)}: give {expected}{(keyword is null ? "" : ", or " + keyword)}");
    }

    /// <summary>An energy option ("-20", "-20meV", "0.02 eV"; a bare number in the model's unit) in the model's unit.</summary>
    public static double ParseEnergy(string text, EnergyUnit unit, string option)
    {
        var parsed = EnergyText.Parse(text);
        if (!parsed.Success) throw new UserInputException($"{option} '{text}': {parsed.Error}");
        return parsed.Quantity.In(unit);
    }

    /// <summary>Solver settings: command-line values first, then the model's [solver] table, then defaults.</summary>
    /// <param name="temperatureOption">The option that gave <paramref name="temperature"/>, for messages.</param>
    /// <param name="tolerance">--tolerance, or null for the model's [solver] value or the default.</param>
    /// <param name="maxIterations">--max-iterations, or null likewise.</param>
    public static SolverSettings Settings(BoundModel model, string? temperature, int? mesh, string temperatureOption = "--temperature",
                                          double? tolerance = null, int? maxIterations = null)
    {
        if (tolerance is { } tol && !(tol > 0 && tol < 1)) throw new UserInputException($"--tolerance {tol}: use a positive number below 1, such as 1e-10");
        if (maxIterations is < 1 or > 100000) throw new UserInputException($"--max-iterations {maxIterations}: use 1..100000");
        if (mesh is < PhysicalRange.MinMesh or > PhysicalRange.MaxMesh)
            throw new UserInputException($"--mesh {mesh}: use {PhysicalRange.MinMesh}..{PhysicalRange.MaxMesh} divisions");
        var hints = model.Solver;
        var settings = new SolverSettings
        {
            Temperature = temperature is null ? hints?.Temperature ?? 0 : ParseTemperature(temperature, model.Unit, temperatureOption),
            Mesh = mesh ?? hints?.Mesh ?? 16,
            Shifted = hints?.Shifted ?? true,
            Tolerance = tolerance ?? hints?.Tolerance ?? 1e-10,
            MaxIterations = maxIterations ?? hints?.MaxIterations ?? 100,
            Symmetry = hints?.Symmetry is { } sym ? Symmetry.SymmetryRequest.Parse(sym) : Symmetry.SymmetryRequest.Auto,
        };
        settings.Validate();
        return settings;
    }
}
