using Google.Rpc;
using Grpc.Core;

namespace Hull.Cli.Client;

/// <summary>Turns a failed call into the exit code and a message that says what the server objected to.</summary>
public static class RpcFailure
{
    /// <summary>
    /// The exit code of a failed call. A refused server certificate counts as unreachable whatever status the client
    /// library gave it (it reports a failed handshake as Internal).
    /// </summary>
    public static int ExitCodeOf(RpcException error) => IsCertificateFailure(error) ? ExitCodes.ServerUnreachable : ExitCodeOf(error.StatusCode);

    private static int ExitCodeOf(StatusCode code) => code switch
    {
        StatusCode.Unavailable => ExitCodes.ServerUnreachable,
        StatusCode.InvalidArgument or StatusCode.FailedPrecondition or StatusCode.AlreadyExists
            or StatusCode.OutOfRange or StatusCode.ResourceExhausted or StatusCode.Aborted => ExitCodes.Rejected,
        StatusCode.NotFound => ExitCodes.NotFound,
        StatusCode.Unauthenticated or StatusCode.PermissionDenied => ExitCodes.NotAuthorized,
        StatusCode.DeadlineExceeded => ExitCodes.TimedOut,
        _ => ExitCodes.ServerError,
    };

    /// <summary>The field violations of a google.rpc.BadRequest detail, if the error carries one.</summary>
    public static IReadOnlyList<BadRequest.Types.FieldViolation> ViolationsOf(RpcException error) =>
        error.GetRpcStatus()?.GetDetail<BadRequest>()?.FieldViolations.ToArray() ?? [];

    /// <summary>The server's google.rpc.ErrorInfo (reason code and domain), if the error carries one.</summary>
    public static ErrorInfo? ReasonOf(RpcException error) => error.GetRpcStatus()?.GetDetail<ErrorInfo>();

    /// <summary>
    /// The error as one JSON object for --json: status, reason code, domain, message, metadata and field
    /// violations, so that scripts branch on the reason rather than on the wording.
    /// </summary>
    public static string DescribeJson(RpcException error, Uri address, string? message = null)
    {
        ErrorInfo? info = ReasonOf(error);
        var body = new Dictionary<string, object?>
        {
            ["status"] = StatusName(error.StatusCode),
            ["reason"] = info?.Reason ?? string.Empty,
            ["domain"] = info?.Domain ?? string.Empty,
            ["message"] = message ?? Describe(error, address),
            ["metadata"] = info?.Metadata.ToDictionary(p => p.Key, p => p.Value) ?? new Dictionary<string, string>(),
            ["field_violations"] = ViolationsOf(error).Select(v => new Dictionary<string, string> { ["field"] = v.Field, ["description"] = v.Description }).ToArray(),
            ["exit_code"] = ExitCodeOf(error),
        };
        return System.Text.Json.JsonSerializer.Serialize(new Dictionary<string, object?> { ["error"] = body });
    }

    /// <summary>"NOT_FOUND" for StatusCode.NotFound: the status as the gRPC specification spells it.</summary>
    private static string StatusName(StatusCode code) =>
        string.Concat(code.ToString().Select((c, i) => i > 0 && char.IsUpper(c) ? "_" + c : c.ToString())).ToUpperInvariant();

    /// <summary>Whether the call failed in the TLS handshake because the server's certificate was refused.</summary>
    private static bool IsCertificateFailure(RpcException error)
    {
        for (Exception? e = error.Status.DebugException; e is not null; e = e.InnerException)
        {
            if (e is System.Security.Authentication.AuthenticationException) return true;
        }
        return false;
    }

    public static string Describe(RpcException error, Uri address)
    {
        if (IsCertificateFailure(error))
        {
            return $"the hull server at {address} presented a certificate this client does not trust: {error.Status.Detail}. " +
                   "For a private CA or a self-signed server certificate, pass its PEM file with --ca-file (or HULL_CA_FILE).";
        }

        if (error.StatusCode == StatusCode.Unavailable)
        {
            return $"cannot reach the hull server at {address}: {error.Status.Detail}. " +
                   "Is it running? Start one with `hull serve`, or point --server (or HULL_SERVER) at it.";
        }

        if (error.StatusCode == StatusCode.DeadlineExceeded)
        {
            return $"the server at {address} did not answer in time; raise --timeout for long work";
        }

        string reason = ReasonOf(error)?.Reason is { Length: > 0 } code ? $", {code}" : string.Empty;
        string text = $"server refused ({error.StatusCode}{reason}): {error.Status.Detail}";
        IReadOnlyList<BadRequest.Types.FieldViolation> violations = ViolationsOf(error);
        if (violations.Count > 1)
        {
            text += Environment.NewLine + string.Join(Environment.NewLine, violations.Select(v => $"  {v.Field}: {v.Description}"));
        }

        return text;
    }
}
