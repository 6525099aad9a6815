namespace Meanfield;

/// <summary>
/// The base of every error in what a user gave the program (a model, scan, solution, exported-model or measured-data
/// file, or a command-line value). The message names the file, the place and the field; the command line reports it
/// as bad input (exit 2). Anything else that escapes is a bug of the program.
/// </summary>
public abstract class InputException(string message, Exception? inner = null) : Exception(message, inner);
