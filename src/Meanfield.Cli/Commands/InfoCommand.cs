using System.CommandLine;
using Meanfield.Output;
using Meanfield.Solver;

namespace Meanfield.Cli.Commands;

/// <summary>
/// `meanfield info [MODEL] [--mesh N]`: version, linear-algebra backend and machine; with a model, the symmetry found,
/// the irreducible mesh and the memory a solve will need.
/// </summary>
public static class InfoCommand
{
    public static Command Build()
    {
        var model = new Argument<string?>("MODEL") { Description = "Model file (.toml): also print its symmetry and mesh plan", Arity = ArgumentArity.ZeroOrOne };
        var set = CommonOptions.Set();
        var mesh = CommonOptions.Mesh();
        var command = new Command("info", "Print the version, the active linear-algebra backend and the machine; with a model, its symmetry and mesh plan") { model, set, mesh };
        command.SetAction(parse =>
        {
            var o = parse.InvocationConfiguration.Output;
            o.WriteLine($"meanfield {Provenance.ToolVersion}");
            o.WriteLine($"linear algebra  {Provenance.Backend}");
            o.WriteLine($"runtime         .NET {Environment.Version}, {Environment.ProcessorCount} cores, {MeshMemory.Gigabytes(MeshMemory.Available)}, {System.Runtime.InteropServices.RuntimeInformation.OSDescription}");
            if (parse.GetValue(model) is not { } path) return ExitCodes.Success;
            var bound = CommonOptions.LoadModel(path, CommonOptions.ParseSets(parse.GetValue(set)));
            var settings = CommonOptions.Settings(bound, null, parse.GetValue(mesh));
            var plan = MeshPlan.For(bound, settings);
            o.WriteLine($"model           {bound.Name} ({path})");
            if (plan.Reduction is not { } r) { o.WriteLine("symmetry        none needed: the lattice has no momentum"); return ExitCodes.Success; }
            o.WriteLine($"symmetry        group of order {r.Operations} ({r.Unitary} unitary, {r.Operations - r.Unitary} with time reversal); {plan.Group.KActions.Count} distinct on k");
            o.WriteLine($"operations      {string.Join(" ", r.Names)}");
            o.WriteLine($"mesh            {settings.Mesh} ({(settings.Shifted ? "shifted" : "Gamma-centred")}): {r.WedgePoints} of {r.FullPoints} k-points, reduction {r.Factor:F2}x ({r.MeshOperations} operations act on it)");
            o.WriteLine($"memory          about {MeshMemory.Gigabytes(plan.EstimatedBytes)} for the saddle point{(plan.KeepsVectors ? " (eigenvectors kept: Newton with the analytic Jacobian)" : " (eigenvectors not kept: Broyden)")}");
            return ExitCodes.Success;
        });
        return command;
    }
}
