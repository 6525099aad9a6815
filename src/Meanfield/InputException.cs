namespace Meanfield;

/// <summary>
/// The base of every error in what a user gave the program (a model, scan, solution, exported-model or measured-data
/// file, or a command-line value). The message names the file, the place and the field; the command line reports it
/// as bad input (exit 2). Anything else that escapes, <see cref="ArgumentException"/> included, is a bug of the
/// program (exit 70): a library precondition our own code violated.
/// </summary>
public abstract class InputException(string message, Exception? inner = null) : Exception(message, inner);

/// <summary>
/// A request the user made (an option, a request record built from options, a value read from a file) that the input
/// cannot satisfy or that is out of range: a temperature window upside down, an unknown path label, a zero plane, a
/// mesh too large for the machine. The message names the field or option and the value. Library entry points throw
/// it where such a value reaches them unchecked; their own internal preconditions stay <see cref="ArgumentException"/>.
/// </summary>
public sealed class RequestError(string message, Exception? inner = null) : InputException(message, inner);
