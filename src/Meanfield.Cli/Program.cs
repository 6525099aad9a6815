using Meanfield.Cli;

return Runner.Run(CommandTree.Build(), args);
