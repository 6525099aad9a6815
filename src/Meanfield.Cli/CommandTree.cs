using System.CommandLine;
using Meanfield.Cli.Commands;

namespace Meanfield.Cli;

/// <summary>Every `meanfield` command, in the order `--help` lists them.</summary>
public static class CommandTree
{
    public static RootCommand Build() => new("meanfield: infinite-U auxiliary-boson mean field of heavy-fermion lattice models")
    {
        InfoCommand.Build(),
        CheckCommand.Build(),
        SolveCommand.Build(),
        BandsCommand.Build(),
        DosCommand.Build(),
        NodesCommand.Build(),
        CurvatureCommand.Build(),
        FacetCommand.Build(),
        InvariantsCommand.Build(),
        HallCommand.Build(),
        DipoleCommand.Build(),
        HeatCommand.Build(),
        KondoScaleCommand.Build(),
        ExportCommand.Build(),
        ScanCommand.Build(),
        MapCommand.Build(),
        BenchCommand.Build(),
    };
}
