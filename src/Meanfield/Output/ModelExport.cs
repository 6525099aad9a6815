using Meanfield.Renormalization;
using Meanfield.Solutions;

namespace Meanfield.Output;

/// <summary>
/// `export`: the one-body model of a solution (the renormalized model: r-scaled bonds with a correlated end, levels
/// eps_f + lambda), of a bare model, or of an exported model read back (converted between forms), with its mu,
/// temperature, basis and provenance, as JSON, CSV or Parquet.
/// </summary>
public static class ModelExport
{
    /// <summary>File extensions an exported model may have.</summary>
    public static readonly IReadOnlyList<string> Extensions = [".json", ".csv", ".parquet"];

    /// <summary>The exported form of <paramref name="solution"/>.</summary>
    /// <exception cref="InvalidDataException">A momentum-free lattice (no real-space matrix elements).</exception>
    public static OneBodyModel Build(Solution solution)
    {
        var src = solution.Model;
        if (src.IsMomentumFree) throw new InvalidDataException($"{src.SourcePath}: a momentum-free lattice has no real-space matrix elements to export");
        var model = solution.Amplitudes is { } amp ? RenormalizedModel.Build(src, amp) : src;
        bool renormalized = solution.Amplitudes is not null || solution.ExportHeader?.Renormalized == true;
        var source = solution.SourcePath is { Length: > 0 } p ? Path.GetFullPath(p) : "";
        var header = OneBodyModel.HeaderOf(model, renormalized, solution.Mu,
            solution.ExportHeader?.MuRule ?? SolutionDocument.RuleName(solution.MuRule), solution.Temperature,
            solution.Mesh?.N1, solution.Mesh?.Shifted ?? true, source);
        if (solution.ExportHeader is { } h) header = header with { ModelPath = h.ModelPath, ModelSha256 = h.ModelSha256 };
        return OneBodyModel.FromModel(model, header);
    }

    /// <summary>Writes the exported form of <paramref name="solution"/> to <paramref name="path"/> (.json, .csv or .parquet), atomically.</summary>
    /// <exception cref="ArgumentException">Another extension.</exception>
    /// <exception cref="InvalidDataException">A momentum-free lattice.</exception>
    public static OneBodyModel Write(Solution solution, string path)
    {
        var model = Build(solution);
        OneBodyModelFiles.Save(model, path);
        return model;
    }
}
