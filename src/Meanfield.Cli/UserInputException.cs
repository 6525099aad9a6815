namespace Meanfield.Cli;

/// <summary>A problem with what the user asked for, reported as one line and exit code <see cref="ExitCodes.BadInput"/>.</summary>
public sealed class UserInputException(string message) : InputException(message);

/// <summary>The question has no answer for this input (exit code 4), for example nodes of a partly filled band.</summary>
public sealed class NoAnswerException(string message) : Exception(message);
