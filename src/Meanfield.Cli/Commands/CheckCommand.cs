using System.CommandLine;
using Meanfield.Models;

namespace Meanfield.Cli.Commands;

/// <summary>`meanfield check MODEL`: validate a model file and summarise it.</summary>
public static class CheckCommand
{
    public static Command Build()
    {
        var model = CommonOptions.ModelArgument();
        var set = CommonOptions.Set();
        var command = new Command("check", "Validate a model file and print a summary (lattice, sites, orbitals, parameters, bands, terms)") { model, set };
        command.SetAction(parse =>
        {
            var bound = CommonOptions.LoadModel(parse.GetValue(model)!, CommonOptions.ParseSets(parse.GetValue(set)));
            foreach (var line in ModelSummary.Describe(bound)) parse.InvocationConfiguration.Output.WriteLine(line);
            if (bound.Solver?.Mesh is not null && !bound.IsMomentumFree)
            {
                // The [solver] mesh must fit this machine: refused here, before any solve (the message gives the estimate).
                var plan = Solver.MeshPlan.For(bound, CommonOptions.Settings(bound, null, null));
                parse.InvocationConfiguration.Output.WriteLine($"mesh plan: {plan.Reduction}; about {Solver.MeshMemory.Gigabytes(plan.EstimatedBytes)}");
            }
            parse.InvocationConfiguration.Output.WriteLine("ok: the model is valid");
            return ExitCodes.Success;
        });
        return command;
    }
}
