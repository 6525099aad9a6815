using System.CommandLine;

namespace Meanfield.Cli;

/// <summary>
/// The inputs every analysis command shares: INPUT (solution or model), --set, --temperature, --mesh and --bare, and
/// the one way they turn into a <see cref="SolutionInput"/>.
/// </summary>
public sealed class SolutionOptions
{
    public Argument<string> Input { get; } = CommonOptions.InputArgument();
    public Option<string[]> Set { get; } = CommonOptions.Set();
    public Option<string?> Temperature { get; } = CommonOptions.Temperature();
    public Option<int?> Mesh { get; } = CommonOptions.Mesh();
    public Option<bool> Bare { get; } = CommonOptions.Bare();

    public void AddTo(Command command)
    {
        command.Add(Input); command.Add(Set); command.Add(Temperature); command.Add(Mesh); command.Add(Bare);
    }

    public SolutionInput Resolve(ParseResult parse, TextWriter log) =>
        SolutionInput.Resolve(parse.GetValue(Input)!, parse.GetValue(Set), parse.GetValue(Temperature), parse.GetValue(Mesh), parse.GetValue(Bare), log);
}
