using Grpc.Core;

namespace Hull.Server.Errors;

/// <summary>
/// A stable, machine-readable reason for an error, sent as google.rpc.ErrorInfo.reason beside the human message.
/// Programs branch on <see cref="Code"/>; it never changes once released (new reasons are added, none renamed).
/// </summary>
/// <param name="Code">UPPER_SNAKE_CASE reason code, unique within <see cref="ErrorReasons.Domain"/>.</param>
/// <param name="Status">The gRPC status that always accompanies it.</param>
/// <param name="Meaning">One line for the server README's table.</param>
public sealed record ErrorReason(string Code, StatusCode Status, string Meaning);
