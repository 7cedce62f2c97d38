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
        return System.Text.Json.JsonSerializer.Serialize(new Dictionary<string, object?> { ["error"] = body }, PlainJson);
    }

    // Only the escapes JSON requires: messages hold "->" and quotes, which people read in a terminal.
    private static readonly System.Text.Json.JsonSerializerOptions PlainJson = new()
    {
        Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    };

    /// <summary>"NOT_FOUND" for StatusCode.NotFound: the status as the gRPC specification spells it.</summary>
    private static string StatusName(StatusCode code) =>
        string.Concat(code.ToString().Select((c, i) => i > 0 && char.IsUpper(c) ? "_" + c : c.ToString())).ToUpperInvariant();

    /// <summary>Whether the call failed in the TLS handshake (a refused certificate, or a server that does not speak TLS).</summary>
    private static bool IsCertificateFailure(RpcException error) => HandshakeFailure(error) is not null;

    /// <summary>The TLS handshake's own error, when the call failed there.</summary>
    private static System.Security.Authentication.AuthenticationException? HandshakeFailure(RpcException error)
    {
        for (Exception? e = error.Status.DebugException; e is not null; e = e.InnerException)
        {
            if (e is System.Security.Authentication.AuthenticationException handshake) return handshake;
        }
        return null;
    }

    /// <summary>What the connection itself reported ("Connection refused (127.0.0.1:50551)"), without the client
    /// library's wrapping and exception type names.</summary>
    private static string TransportDetail(RpcException error)
    {
        Exception? innermost = error.Status.DebugException;
        while (innermost?.InnerException is not null) innermost = innermost.InnerException;
        return innermost?.Message is { Length: > 0 } message ? message : error.Status.Detail;
    }

    public static string Describe(RpcException error, Uri address)
    {
        if (HandshakeFailure(error) is { } handshake)
        {
            // A refused certificate says so ("The remote certificate is invalid ..."); a plain-text server answers the
            // TLS hello with bytes that are no TLS record, which the handshake reports as a bad frame.
            if (!handshake.Message.Contains("certificate", StringComparison.OrdinalIgnoreCase))
            {
                var plain = new UriBuilder(address) { Scheme = Uri.UriSchemeHttp, Port = address.Port };
                return $"no TLS connection to the hull server at {address}: the server did not answer in TLS ({handshake.Message.TrimEnd('.')}). " +
                       $"A server started without --tls-cert serves plain text: use {plain.Uri.ToString().TrimEnd('/')}";
            }

            return $"the hull server at {address} presented a certificate this client does not trust ({handshake.Message.TrimEnd('.')}). " +
                   "For a private CA or a self-signed server certificate, pass its PEM file with --ca-file (or HULL_CA_FILE).";
        }

        if (error.StatusCode == StatusCode.Unavailable)
        {
            return $"cannot reach the hull server at {address}: {TransportDetail(error).TrimEnd('.')}. " +
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
