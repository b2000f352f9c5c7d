namespace BarrierLedger.Cli;

/// <summary>Process exit codes (documented in docs/formats.md).</summary>
public static class ExitCodes
{
    /// <summary>Everything read and every check passed.</summary>
    public const int Ok = 0;
    /// <summary>The input was read but a check failed (for example a saddle point with two significant imaginary modes).</summary>
    public const int ChecksFailed = 1;
    /// <summary>An input could not be read (errors are listed with file and line or JSON path).</summary>
    public const int Unreadable = 2;
    /// <summary>The command line itself is wrong; the usage is printed. Shares the code of unreadable input: nothing was computed.</summary>
    public const int UsageError = 2;
    /// <summary>A bug in barrierledger; the message says what failed.</summary>
    public const int InternalError = 3;
}

/// <summary>Thrown by a command when option values are inconsistent in a way the parser cannot see; prints the usage.</summary>
public sealed class UsageException(string message) : Exception(message);
