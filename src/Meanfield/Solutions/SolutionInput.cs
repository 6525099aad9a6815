using System.Globalization;
using Meanfield.Binding;
using Meanfield.Output;

namespace Meanfield.Solutions;

/// <summary>What an INPUT file is.</summary>
public enum InputKind
{
    /// <summary>A model file (TOML).</summary>
    ModelFile,
    /// <summary>A solution file written by `solve` (JSON, format meanfield-solution/1).</summary>
    SolutionFile,
    /// <summary>A one-body model written by `export` (JSON, CSV or Parquet, format meanfield-one-body-model/1).</summary>
    ExportedModel,
}

/// <summary>The one place where an input file is recognised: by its format tag first, then by its extension.</summary>
public static class SolutionInput
{
    /// <summary>The kind of <paramref name="path"/>: an exported model by its format tag, a solution by .json, else a model file.</summary>
    public static InputKind Recognise(string path) =>
        OneBodyModelFiles.IsExportedModel(path) ? InputKind.ExportedModel
        : path.EndsWith(".json", StringComparison.OrdinalIgnoreCase) ? InputKind.SolutionFile
        : InputKind.ModelFile;

    /// <summary>Why `solve` has nothing to do for a model without a correlated shell (an exported model among them).</summary>
    public static string NothingToSolve(BoundModel model, OneBodyHeader? export = null) => export is null
        ? $"{model.SourcePath}: the model has no correlated shell, so there is no saddle point to solve; the analyses (bands, dos, nodes, ...) take it as a bare model"
        : $"{model.SourcePath}: an exported one-body model has no correlated shell, so there is no saddle point to solve; bands, dos, nodes and the other analyses read it directly, with mu = {export.Mu.ToString("G10", CultureInfo.InvariantCulture)} {Units.EnergyUnits.Symbol(export.Unit)} as exported";

    /// <summary>Refuses what cannot apply to an exported model: parameter overrides, a new temperature, --bare.</summary>
    /// <returns>The message, or null when nothing is refused.</returns>
    public static string? RefusedForExport(string path, bool overrides, bool temperature, bool bare) =>
        overrides ? $"--set: {path} is an exported one-body model; its parameters were fixed when it was exported (apply --set to the model file or solution it came from)"
        : temperature ? $"--temperature: {path} is an exported one-body model at its exported temperature and mu; solve the model again at another temperature and export that"
        : bare ? $"--bare: {path} is an exported one-body model; its bare model is the model file it came from"
        : null;
}
