using InspectionUpdate.Application;

namespace InspectionUpdate.Cli.Infrastructure;

/// <summary>Process exit codes of inspection-update (documented in docs/cli.md; stable).</summary>
public static class ExitCodes
{
    /// <summary>Success.</summary>
    public const int Ok = 0;

    /// <summary>An unexpected internal error (a bug): please report it with the --verbose output.</summary>
    public const int InternalError = 1;

    /// <summary>Bad input: unknown command or option, a missing or malformed file, a field out of range.</summary>
    public const int BadInput = 2;

    /// <summary>The command ran, but at least one reported number did not converge (it is flagged in the output).</summary>
    public const int NotConverged = 3;

    /// <summary>The register could not be opened, is of an unknown schema, failed its check, or refused a write.</summary>
    public const int RegisterError = 4;

    /// <summary>The command needs a part of the engine that this build does not have yet.</summary>
    public const int NotAvailable = 5;

    /// <summary>verify: at least one verification case failed its tolerance.</summary>
    public const int VerificationFailed = 6;

    /// <summary>The exit code of an application failure.</summary>
    public static int Of(FailureKind kind) => kind switch
    {
        FailureKind.BadInput => BadInput,
        FailureKind.Register => RegisterError,
        FailureKind.NotConverged => NotConverged,
        FailureKind.NotAvailable => NotAvailable,
        _ => InternalError,
    };

    /// <summary>Stable name of an exit code, used in JSON errors.</summary>
    public static string Name(int code) => code switch
    {
        Ok => "ok",
        BadInput => "bad_input",
        NotConverged => "not_converged",
        RegisterError => "register_error",
        NotAvailable => "not_available",
        VerificationFailed => "verification_failed",
        _ => "internal_error",
    };
}
