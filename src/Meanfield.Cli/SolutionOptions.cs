using System.CommandLine;
using Meanfield.Solutions;
using Meanfield.Solver;

namespace Meanfield.Cli;

/// <summary>
/// The inputs every analysis command shares: INPUT (solution or model), --set, --temperature, --mesh and --bare, and
/// the one way they turn into the library's <see cref="Solution"/> handle.
/// </summary>
public sealed class SolutionOptions
{
    public Argument<string> Input { get; } = CommonOptions.InputArgument();
    public Option<string[]> Set { get; } = CommonOptions.Set();
    public Option<string?> Temperature { get; } = CommonOptions.Temperature();
    public Option<int?> Mesh { get; } = CommonOptions.Mesh();
    public Option<bool> Bare { get; } = CommonOptions.Bare();
    public Option<double?> Tolerance { get; } = CommonOptions.Tolerance();
    public Option<int?> MaxIterations { get; } = CommonOptions.MaxIterations();

    public void AddTo(Command command)
    {
        command.Add(Input); command.Add(Set); command.Add(Temperature); command.Add(Mesh); command.Add(Bare);
        command.Add(Tolerance); command.Add(MaxIterations);
    }

    public Solution Resolve(ParseResult parse, TextWriter log) =>
        Open(parse.GetValue(Input)!, parse.GetValue(Set), parse.GetValue(Temperature), parse.GetValue(Mesh), parse.GetValue(Bare), log,
             parse.GetValue(Tolerance), parse.GetValue(MaxIterations));

    /// <summary>
    /// A solution file (.json) as written; an exported one-body model (.json, .csv, .parquet from `export`) as it
    /// stands; a model file (.toml) solved on the fly (its one-line summary goes to <paramref name="log"/>), or taken
    /// bare with <paramref name="bare"/> or when it has no correlated shell.
    /// </summary>
    public static Solution Open(string input, string[]? sets, string? temperature, int? mesh, bool bare, TextWriter log,
                                double? tolerance = null, int? maxIterations = null)
    {
        switch (SolutionInput.Recognise(input))
        {
            case InputKind.ExportedModel:
                if (SolutionInput.RefusedForExport(input, sets is { Length: > 0 }, temperature is not null, bare) is { } refusal)
                    throw new UserInputException(refusal);
                if (mesh is < Models.PhysicalRange.MinMesh or > Models.PhysicalRange.MaxMesh)
                    throw new UserInputException($"--mesh {mesh}: use {Models.PhysicalRange.MinMesh}..{Models.PhysicalRange.MaxMesh} divisions");
                return Solution.FromExport(Output.OneBodyModelFiles.Load(input), mesh);
            case InputKind.SolutionFile:
                return Solution.Load(input, CommonOptions.ParseSets(sets));
        }
        var model = CommonOptions.LoadModel(input, CommonOptions.ParseSets(sets));
        if (bare || model.Shells.Count == 0)
        {
            if (model.IsMomentumFree) throw new UserInputException($"{input}: a momentum-free lattice has no bare k-resolved bands");
            return Solution.Bare(model, mesh ?? model.Solver?.Mesh ?? 16);
        }
        var settings = CommonOptions.Settings(model, temperature, mesh, "--temperature", tolerance, maxIterations);
        var sp = new SaddlePointSolver(model, settings).Solve();
        log.WriteLine(Summary.SolutionLine(sp, model));
        if (!sp.Converged) throw new NotConvergedException(sp);
        return Solution.FromSaddlePoint(model, sp, settings);
    }
}
