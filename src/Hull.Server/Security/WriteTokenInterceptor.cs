using System.Security.Cryptography;
using System.Text;
using Grpc.Core;
using Grpc.Core.Interceptors;
using Hull.Server.Errors;

namespace Hull.Server.Security;

/// <summary>
/// Requires "authorization: Bearer &lt;token&gt;" on write methods when the server has a write token: a missing or
/// malformed header is UNAUTHENTICATED, a wrong token PERMISSION_DENIED. Reads stay open.
/// </summary>
public sealed class WriteTokenInterceptor : Interceptor
{
    /// <summary>Full gRPC method names that change stored data.</summary>
    public static IReadOnlySet<string> WriteMethods { get; } = new HashSet<string>(StringComparer.Ordinal)
    {
        "/hull.v1.DatasetService/CreateDataset",
        "/hull.v1.DatasetService/DeleteDataset",
        "/hull.v1.DatasetService/ImportEntries",
        "/hull.v1.DatasetService/BeginImport",
        "/hull.v1.DatasetService/StageEntries",
        "/hull.v1.DatasetService/CommitImport",
        "/hull.v1.DatasetService/CancelImport",
        "/hull.v1.DatasetService/DeleteVersion",
        "/hull.v1.DefectService/ImportDefectStudy",
        "/hull.v1.CorrectionService/PutCorrectionSet",
        "/hull.v1.CorrectionService/DeriveCorrectedVersion",
        "/hull.v1.CurationService/CurateVersion",
    };

    private const string Scheme = "Bearer ";
    private readonly byte[]? _expected;

    public WriteTokenInterceptor(WriteTokenSetting setting)
    {
        _expected = setting.Token is null ? null : Encoding.UTF8.GetBytes(setting.Token);
    }

    public override Task<TResponse> UnaryServerHandler<TRequest, TResponse>(
        TRequest request, ServerCallContext context, UnaryServerMethod<TRequest, TResponse> continuation)
    {
        Authorize(context);
        return continuation(request, context);
    }

    public override Task ServerStreamingServerHandler<TRequest, TResponse>(
        TRequest request, IServerStreamWriter<TResponse> responseStream, ServerCallContext context,
        ServerStreamingServerMethod<TRequest, TResponse> continuation)
    {
        Authorize(context);
        return continuation(request, responseStream, context);
    }

    public override Task<TResponse> ClientStreamingServerHandler<TRequest, TResponse>(
        IAsyncStreamReader<TRequest> requestStream, ServerCallContext context,
        ClientStreamingServerMethod<TRequest, TResponse> continuation)
    {
        Authorize(context);
        return continuation(requestStream, context);
    }

    public override Task DuplexStreamingServerHandler<TRequest, TResponse>(
        IAsyncStreamReader<TRequest> requestStream, IServerStreamWriter<TResponse> responseStream,
        ServerCallContext context, DuplexStreamingServerMethod<TRequest, TResponse> continuation)
    {
        Authorize(context);
        return continuation(requestStream, responseStream, context);
    }

    private void Authorize(ServerCallContext context)
    {
        if (_expected is null || !WriteMethods.Contains(context.Method)) return;

        string? header = context.RequestHeaders.GetValue("authorization");
        if (header is null || !header.StartsWith(Scheme, StringComparison.OrdinalIgnoreCase))
        {
            throw RpcErrors.Plain(StatusCode.Unauthenticated,
                "this server requires a bearer token for writes: send metadata 'authorization: Bearer <token>'", ErrorReasons.WriteTokenRequired);
        }

        byte[] given = Encoding.UTF8.GetBytes(header[Scheme.Length..].Trim());
        // Constant-time comparison: the time taken says nothing about how much of the token matched.
        if (!CryptographicOperations.FixedTimeEquals(given, _expected))
        {
            throw RpcErrors.Plain(StatusCode.PermissionDenied, "the bearer token is not the server's write token", ErrorReasons.WriteTokenRejected);
        }
    }
}
