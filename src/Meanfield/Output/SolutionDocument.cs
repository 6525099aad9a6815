using System.Text.Json;
using System.Text.Json.Serialization;
using Meanfield.Binding;
using Meanfield.Renormalization;
using Meanfield.Solver;

namespace Meanfield.Output;

/// <summary>
/// The JSON form of a saddle-point solution (`meanfield solve --out solution.json`). Energies are in
/// <see cref="EnergyUnit"/>, per unit cell; every field is described in the README's solution-file table.
/// </summary>
public sealed record SolutionDocument
{
    public required string Format { get; init; }
    public required bool Converged { get; init; }
    public required int Iterations { get; init; }
    public required double ResidualNorm { get; init; }
    public required string EnergyUnit { get; init; }
    public required double Temperature { get; init; }
    public required double TemperatureK { get; init; }
    public required double Mu { get; init; }
    public required double FreeEnergy { get; init; }
    public double? DecoupledFreeEnergy { get; init; }
    public required double ElectronsPerCell { get; init; }
    public required string Branch { get; init; }
    /// <summary>How mu was fixed ("fermi-dirac", "node-energy", "middle-of-gap", "ground-state-in-band").</summary>
    public string? MuRule { get; init; }
    /// <summary>The spectrum digest's columns (phase label, gaps, DOS at mu, nodes): the record scans write too.</summary>
    public Analysis.SpectrumColumns? Spectrum { get; init; }
    public required IReadOnlyList<SiteEntry> Sites { get; init; }
    public required IReadOnlyDictionary<string, double> Parameters { get; init; }
    public required SamplingEntry Sampling { get; init; }
    public required string ModelPath { get; init; }
    public required string ModelSha256 { get; init; }
    public required string ToolVersion { get; init; }
    public required string Backend { get; init; }
    public required string Created { get; init; }
    public required double WallSeconds { get; init; }
    public IReadOnlyList<string> Notes { get; init; } = [];

    /// <summary>One shell group. At finite U also U and the four bosons e, p, d (Kotliar &amp; Ruckenstein, PRL 57, 1362
    /// (1986)), with r = q = p (e + d) / sqrt((n_f/2)(1 - n_f/2)) and z = r^2; absent (null) at infinite U.</summary>
    public sealed record SiteEntry(string Name, int Shells, double R, double Lambda, double BareLevel,
                                   double RenormalizedLevel, [property: JsonPropertyName("n_f")] double NF, double Z,
                                   double? U = null, double? E = null, double? P = null, double? D = null)
    {
        /// <summary>True for a finite-U (four-boson) group.</summary>
        [JsonIgnore] public bool HasFiniteU => U is not null;
    }

    public sealed record SamplingEntry(string Description, int? Mesh, bool? Shifted, string Occupations);

    public const string FormatTag = "meanfield-solution/1";

    // Source-generated metadata (SolutionJsonContext) for reading: no reflection and far less JIT at start-up than the
    // reflection serializer. Writing goes through the serialization-only SolutionJsonWriterContext (same bytes).
    private static JsonSerializerOptions Json => SolutionJsonContext.Default.Options;

    /// <summary>The document of a freshly solved <paramref name="solution"/>, with its digest's columns when given.</summary>
    /// <exception cref="ArgumentException">A solution not solved in this process (files and bare models have no saddle point to write).</exception>
    public static SolutionDocument From(Solutions.Solution solution, Analysis.SpectrumDigest? digest = null)
    {
        var sp = solution.SaddlePoint ?? throw new ArgumentException("only a solution solved in this process can be written");
        var model = solution.Model;
        return new()
        {
            Format = FormatTag, Converged = sp.Converged, Iterations = sp.Iterations, ResidualNorm = sp.ResidualNorm,
            EnergyUnit = Units.EnergyUnits.Symbol(model.Unit), Temperature = sp.Temperature,
            TemperatureK = sp.Temperature * Units.EnergyUnits.Kelvins(model.Unit), Mu = solution.Mu, MuRule = RuleName(solution.MuRule),
            FreeEnergy = sp.FreeEnergy, DecoupledFreeEnergy = sp.DecoupledFreeEnergy, ElectronsPerCell = sp.ElectronsPerCell,
            Branch = sp.Branch == SaddlePointBranch.Kondo ? "kondo" : "decoupled", Spectrum = digest?.Columns,
            Sites = [.. sp.Groups.Select(g => new SiteEntry(g.Name, g.Shells, g.R, g.Lambda, g.BareLevel,
                                                           g.BareLevel + g.Lambda - solution.Mu, g.FOccupation, g.Z,
                                                           g.HasFiniteU ? g.U : null, g.Bosons?.E, g.Bosons?.P, g.Bosons?.D))],
            Parameters = model.Parameters.ToDictionary(p => p.Key, p => p.Value),
            Sampling = new(sp.Sampling, solution.Mesh is null ? null : solution.Mesh.N1, solution.Mesh?.Shifted,
                           sp.Temperature > 0 ? "fermi-dirac" : solution.Mesh is null ? "step" : "tetrahedra"),
            ModelPath = string.IsNullOrEmpty(model.SourcePath) ? "" : Path.GetFullPath(model.SourcePath), ModelSha256 = Provenance.Hash(model.SourceText), ToolVersion = Provenance.ToolVersion,
            Backend = Provenance.Backend, Created = Provenance.NowUtc(), WallSeconds = sp.WallSeconds, Notes = sp.Notes,
        };
    }

    /// <summary>File form of a chemical-potential rule.</summary>
    public static string RuleName(Solutions.ChemicalPotentialRule rule) => rule switch
    {
        Solutions.ChemicalPotentialRule.FermiDirac => "fermi-dirac",
        Solutions.ChemicalPotentialRule.NodeEnergy => "node-energy",
        Solutions.ChemicalPotentialRule.MiddleOfGap => "middle-of-gap",
        Solutions.ChemicalPotentialRule.GroundStateInBand => "ground-state-in-band",
        _ => "from-file",
    };

    /// <summary>The file text: indented JSON, snake_case names, null fields left out.</summary>
    /// <exception cref="ArgumentException">A number in the document is not finite (a bug: solutions never carry NaN).</exception>
    public string ToJson() => JsonSerializer.Serialize(this, SolutionJsonWriterContext.Default.SolutionDocument);

    public void Save(string path) => AtomicFile.WriteText(path, ToJson() + "\n");

    /// <summary>
    /// Reads a solution file and checks its own fields (<see cref="SolutionValidator.CheckFields"/>): present, finite,
    /// in range and consistent with each other.
    /// </summary>
    /// <exception cref="InvalidDataException">Not a solution file, or a field is missing, not finite or out of range;
    /// the message names the file and the field.</exception>
    public static SolutionDocument Load(string path)
    {
        try
        {
            var doc = JsonSerializer.Deserialize<SolutionDocument>(File.ReadAllText(path), Json)
                      ?? throw new InvalidDataException($"{path}: empty solution file");
            if (doc.Format != FormatTag) throw new InvalidDataException($"{path}: format '{doc.Format}' is not '{FormatTag}'");
            if (doc.Notes is null) doc = doc with { Notes = [] };
            SolutionValidator.CheckFields(doc, path);
            return doc;
        }
        catch (JsonException e)
        {
            throw new InvalidDataException($"{path}:{e.LineNumber + 1}: not a meanfield solution file ({e.Message})", e);
        }
    }

    /// <summary>The model path a solution file names, or null when the file cannot be read as JSON (no validation).</summary>
    public static string? PeekModelPath(string path)
    {
        try
        {
            using var doc = JsonDocument.Parse(File.ReadAllBytes(path));
            return doc.RootElement.ValueKind == JsonValueKind.Object && doc.RootElement.TryGetProperty("model_path", out var p)
                   && p.ValueKind == JsonValueKind.String ? p.GetString() : null;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or JsonException) { return null; }
    }

    /// <summary>
    /// The model this solution names, bound with the solution's parameter values and then <paramref name="overrides"/>,
    /// after checking that the model file exists, that its text is the one solved (SHA-256) and that the solution lists
    /// exactly the model's parameters.
    /// </summary>
    /// <exception cref="InvalidDataException">The model file is missing or changed, or the parameters do not match.</exception>
    /// <exception cref="Models.ModelError">The model or an override does not bind.</exception>
    public BoundModel BindModel(string solutionPath, IReadOnlyDictionary<string, string>? overrides = null)
    {
        if (!File.Exists(ModelPath)) throw new InvalidDataException($"{solutionPath}: model_path: its model file '{ModelPath}' is not found");
        var spec = Models.ModelFile.Load(ModelPath);
        CheckHash(spec.SourceText, solutionPath);
        var names = spec.Parameters.Select(p => p.Name).ToList();
        foreach (var name in Parameters.Keys)
            if (!names.Contains(name))
                throw SolutionValidator.Bad(solutionPath, $"parameters.{name}", $"is not a parameter of the model {ModelPath}");
        foreach (var name in names)
            if (!Parameters.ContainsKey(name))
                throw SolutionValidator.Bad(solutionPath, "parameters", $"'{name}' of the model is missing");
        var all = Parameters.ToDictionary(p => p.Key, p => p.Value.ToString("R", System.Globalization.CultureInfo.InvariantCulture));
        foreach (var (name, value) in overrides ?? new Dictionary<string, string>()) all[name] = value;
        return Models.ModelBinder.Bind(spec, all);
    }

    /// <summary>
    /// Amplitudes for the model's shell groups, after checking that the solution belongs to this model text and fits
    /// it (<see cref="SolutionValidator.CheckAgainst"/>) and, with <paramref name="verifySaddlePoint"/> (default), that it
    /// solves the saddle-point equations (<see cref="SolutionValidator.CheckSaddlePoint"/>: one pass over its mesh).
    /// </summary>
    /// <exception cref="InvalidDataException">The solution was made from another model text, does not fit the model, or
    /// is not a saddle point of it.</exception>
    public MeanFieldAmplitudes AmplitudesFor(BoundModel model, string solutionPath, bool verifySaddlePoint = true)
    {
        CheckHash(model.SourceText, solutionPath);
        SolutionValidator.CheckAgainst(this, model, solutionPath);
        if (verifySaddlePoint) SolutionValidator.CheckSaddlePoint(this, model, solutionPath);
        return new MeanFieldAmplitudes([.. Sites.Select(s => s.R)], [.. Sites.Select(s => s.Lambda)]);
    }

    private void CheckHash(string modelText, string solutionPath)
    {
        var hash = Provenance.Hash(modelText);
        if (hash != ModelSha256)
            throw new InvalidDataException($"{solutionPath}: solution was made from a different model text (model hash {ModelSha256[..12]}, this model {hash[..12]}); solve again");
    }
}

/// <summary>Compile-time JSON metadata of <see cref="SolutionDocument"/>: snake_case names, indented, nulls left out.</summary>
[JsonSourceGenerationOptions(PropertyNamingPolicy = JsonKnownNamingPolicy.SnakeCaseLower, WriteIndented = true,
                             DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
                             NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals)]
[JsonSerializable(typeof(SolutionDocument))]
internal sealed partial class SolutionJsonContext : JsonSerializerContext;

/// <summary>
/// Compile-time writer of <see cref="SolutionDocument"/> with the options of <see cref="SolutionJsonContext"/> but
/// serialization only: the generated code writes the fields straight to the JSON writer, without the property metadata
/// the reader needs. That cuts the methods compiled at start-up for writing a solution from about 340 to 130 (counted
/// with the JIT's method summary). It has no named floating-point literals, because they rule out that straight path:
/// a non-finite number in a solution is a bug and makes the writer throw instead of writing NaN.
/// </summary>
[JsonSourceGenerationOptions(PropertyNamingPolicy = JsonKnownNamingPolicy.SnakeCaseLower, WriteIndented = true,
                             DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
                             GenerationMode = JsonSourceGenerationMode.Serialization)]
[JsonSerializable(typeof(SolutionDocument))]
internal sealed partial class SolutionJsonWriterContext : JsonSerializerContext;
