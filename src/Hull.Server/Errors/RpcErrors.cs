using Google.Protobuf.WellKnownTypes;
using Google.Rpc;
using Grpc.Core;

namespace Hull.Server.Errors;

/// <summary>
/// Builds the errors the service answers with: a gRPC status code, a message that says what and where, and for
/// bad fields a google.rpc.BadRequest detail listing each violation (field path and description).
/// </summary>
public static class RpcErrors
{
    /// <summary>Most violations listed in one error: enough to fix a file in one pass, small enough to read.</summary>
    public const int MaxViolationsReported = 100;

    public static RpcException InvalidArgument(string message, IReadOnlyList<FieldViolation> violations) =>
        WithViolations(StatusCode.InvalidArgument, message, violations);

    public static RpcException InvalidArgument(string field, string description) =>
        WithViolations(StatusCode.InvalidArgument, $"{field}: {description}", [new FieldViolation(field, description)]);

    public static RpcException NotFound(string message, string? field = null) =>
        field is null ? Plain(StatusCode.NotFound, message) : WithViolations(StatusCode.NotFound, message, [new FieldViolation(field, message)]);

    public static RpcException AlreadyExists(string message, string? field = null) =>
        field is null ? Plain(StatusCode.AlreadyExists, message) : WithViolations(StatusCode.AlreadyExists, message, [new FieldViolation(field, message)]);

    public static RpcException FailedPrecondition(string message) => Plain(StatusCode.FailedPrecondition, message);

    public static RpcException ResourceExhausted(string message, string? field = null) =>
        field is null ? Plain(StatusCode.ResourceExhausted, message) : WithViolations(StatusCode.ResourceExhausted, message, [new FieldViolation(field, message)]);

    public static RpcException Plain(StatusCode code, string message) =>
        new Google.Rpc.Status { Code = (int)code, Message = message }.ToRpcException();

    public static RpcException WithViolations(StatusCode code, string message, IReadOnlyList<FieldViolation> violations)
    {
        var badRequest = new BadRequest();
        foreach (FieldViolation v in violations.Take(MaxViolationsReported))
        {
            badRequest.FieldViolations.Add(new BadRequest.Types.FieldViolation { Field = v.Field, Description = v.Description });
        }

        var status = new Google.Rpc.Status { Code = (int)code, Message = message };
        status.Details.Add(Any.Pack(badRequest));
        return status.ToRpcException();
    }
}
