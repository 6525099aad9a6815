using System.CommandLine;
using Meanfield.Cli;
using Meanfield.Cli.Commands;

var root = new RootCommand("meanfield: infinite-U auxiliary-boson mean field of heavy-fermion lattice models")
{
    InfoCommand.Build(),
    CheckCommand.Build(),
    SolveCommand.Build(),
    BandsCommand.Build(),
    KondoScaleCommand.Build(),
    ExportCommand.Build(),
    ScanCommand.Build(),
    MapCommand.Build(),
    BenchCommand.Build(),
};
return Runner.Run(root, args);
