namespace Meanfield.Cli;

/// <summary>A problem with what the user asked for, reported as one line and exit code <see cref="ExitCodes.BadInput"/>.</summary>
public sealed class UserInputException(string message) : Exception(message);
