namespace Meanfield.Cli;

/// <summary>Process exit codes, documented in the README.</summary>
public static class ExitCodes
{
    public const int Success = 0;
    /// <summary>Command-line usage error (unknown option, missing argument); System.CommandLine's own code.</summary>
    public const int Usage = 1;
    /// <summary>Bad input file or value: model, scan, solution, measured data, option value.</summary>
    public const int BadInput = 2;
    /// <summary>The saddle point did not converge; no result file was written.</summary>
    public const int NotConverged = 3;
    /// <summary>The question has no answer for this spectrum (for example nodes of a metal with overlapping bands).</summary>
    public const int NoAnswer = 4;
    /// <summary>An unexpected failure inside meanfield (a bug: please report it).</summary>
    public const int Internal = 70;
}
