using System.Diagnostics;
using Grpc.Core;
using Grpc.Core.Interceptors;
using Microsoft.Extensions.Logging;

namespace Hull.Server.Errors;

/// <summary>
/// The last line of every call: translates store and science errors into gRPC statuses, reports cancellation as
/// CANCELLED (or DEADLINE_EXCEEDED), hides unexpected exceptions behind INTERNAL (logged with a trace id the
/// caller also sees), and logs one structured line per call.
/// </summary>
public sealed class ErrorTranslationInterceptor(ILogger<ErrorTranslationInterceptor> logger) : Interceptor
{
    public override async Task<TResponse> UnaryServerHandler<TRequest, TResponse>(
        TRequest request, ServerCallContext context, UnaryServerMethod<TRequest, TResponse> continuation)
    {
        long start = Stopwatch.GetTimestamp();
        try
        {
            TResponse response = await continuation(request, context);
            LogCall(context, StatusCode.OK, start);
            return response;
        }
        catch (Exception e)
        {
            throw Fail(e, context, start);
        }
    }

    public override async Task ServerStreamingServerHandler<TRequest, TResponse>(
        TRequest request, IServerStreamWriter<TResponse> responseStream, ServerCallContext context,
        ServerStreamingServerMethod<TRequest, TResponse> continuation)
    {
        long start = Stopwatch.GetTimestamp();
        try
        {
            await continuation(request, responseStream, context);
            LogCall(context, StatusCode.OK, start);
        }
        catch (Exception e)
        {
            throw Fail(e, context, start);
        }
    }

    public override async Task<TResponse> ClientStreamingServerHandler<TRequest, TResponse>(
        IAsyncStreamReader<TRequest> requestStream, ServerCallContext context,
        ClientStreamingServerMethod<TRequest, TResponse> continuation)
    {
        long start = Stopwatch.GetTimestamp();
        try
        {
            TResponse response = await continuation(requestStream, context);
            LogCall(context, StatusCode.OK, start);
            return response;
        }
        catch (Exception e)
        {
            throw Fail(e, context, start);
        }
    }

    public override async Task DuplexStreamingServerHandler<TRequest, TResponse>(
        IAsyncStreamReader<TRequest> requestStream, IServerStreamWriter<TResponse> responseStream,
        ServerCallContext context, DuplexStreamingServerMethod<TRequest, TResponse> continuation)
    {
        long start = Stopwatch.GetTimestamp();
        try
        {
            await continuation(requestStream, responseStream, context);
            LogCall(context, StatusCode.OK, start);
        }
        catch (Exception e)
        {
            throw Fail(e, context, start);
        }
    }

    private RpcException Fail(Exception error, ServerCallContext context, long start)
    {
        RpcException result = error switch
        {
            // An error raised without the factories still leaves with an ErrorInfo: its status's general reason.
            RpcException rpc => RpcErrors.WithErrorInfo(rpc),
            OperationCanceledException when context.Deadline <= DateTime.UtcNow =>
                RpcErrors.Plain(StatusCode.DeadlineExceeded, "the deadline passed before the work finished", ErrorReasons.DeadlineExceeded),
            OperationCanceledException => RpcErrors.Plain(StatusCode.Cancelled, "the call was cancelled", ErrorReasons.Cancelled),
            _ => StoreErrorTranslation.Translate(error, DatasetFieldOf(context.Method)) ?? Internal(error, context),
        };
        LogCall(context, result.StatusCode, start, result.Status.Detail);
        return result;
    }

    private RpcException Internal(Exception error, ServerCallContext context)
    {
        string traceId = Activity.Current?.TraceId.ToString() ?? context.GetHttpContext().TraceIdentifier;
        logger.LogError(error, "Unexpected failure in {Method} (trace {TraceId})", context.Method, traceId);
        return RpcErrors.Plain(StatusCode.Internal, $"internal error (trace {traceId}); the server log has the details",
            ErrorReasons.InternalError, ("trace_id", traceId));
    }

    private void LogCall(ServerCallContext context, StatusCode code, long start, string? detail = null)
    {
        double elapsedMs = Stopwatch.GetElapsedTime(start).TotalMilliseconds;
        if (code == StatusCode.OK)
        {
            logger.LogDebug("{Method} {StatusCode} in {ElapsedMs:F2} ms", context.Method, code, elapsedMs);
        }
        else
        {
            logger.LogInformation("{Method} {StatusCode} in {ElapsedMs:F2} ms: {Detail}", context.Method, code, elapsedMs, detail);
        }
    }

    // CreateDataset, DescribeDataset and DeleteDataset name the dataset in "name"; every other request in "dataset".
    private static string DatasetFieldOf(string method) =>
        method.EndsWith("/CreateDataset", StringComparison.Ordinal)
        || method.EndsWith("/DescribeDataset", StringComparison.Ordinal)
        || method.EndsWith("/DeleteDataset", StringComparison.Ordinal)
            ? "name"
            : "dataset";
}
