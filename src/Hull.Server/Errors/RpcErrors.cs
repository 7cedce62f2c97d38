using Google.Protobuf;
using Google.Protobuf.WellKnownTypes;
using Google.Rpc;
using Grpc.Core;

namespace Hull.Server.Errors;

/// <summary>
/// Builds the errors the service answers with: a gRPC status code, a message that says what and where, and in the
/// status details a google.rpc.ErrorInfo (a stable <see cref="ErrorReason"/> code of ours, the domain and a few
/// metadata values) followed by the detail that fits the status: BadRequest field violations for bad fields,
/// ResourceInfo for a missing or existing resource, PreconditionFailure for a state of the data, QuotaFailure for
/// a limit. Every error the service raises goes through <see cref="Build"/>, so none lacks its ErrorInfo.
/// </summary>
public static class RpcErrors
{
    /// <summary>Most violations listed in one error: enough to fix a file in one pass, small enough to read.</summary>
    public const int MaxViolationsReported = 100;

    public static RpcException InvalidArgument(string message, IReadOnlyList<FieldViolation> violations, ErrorReason? reason = null) =>
        WithViolations(StatusCode.InvalidArgument, message, violations, reason);

    public static RpcException InvalidArgument(string field, string description, ErrorReason? reason = null) =>
        WithViolations(StatusCode.InvalidArgument, $"{field}: {description}", [new FieldViolation(field, description)], reason);

    /// <summary>NOT_FOUND for something other than a dataset, version or entry (those have their own factories).</summary>
    public static RpcException NotFound(string message, string? field = null, ErrorReason? reason = null) =>
        Build(StatusCode.NotFound, message, reason, Metadata(), Resource(string.Empty, string.Empty, message), Violations(field, message));

    public static RpcException DatasetNotFound(string dataset, string message, string field = "dataset") =>
        Build(StatusCode.NotFound, message, ErrorReasons.DatasetNotFound, Metadata(("dataset", dataset)),
            Resource("hull.v1.Dataset", dataset, message), Violations(field, message));

    /// <summary>NOT_FOUND for a version; <paramref name="version"/> is null or 0 when the latest was asked for and there is none.</summary>
    public static RpcException VersionNotFound(string dataset, long? version, string message, string field = "version")
    {
        string number = version is > 0 ? version.Value.ToString(System.Globalization.CultureInfo.InvariantCulture) : "latest";
        return Build(StatusCode.NotFound, message, ErrorReasons.VersionNotFound, Metadata(("dataset", dataset), ("version", number)),
            Resource("hull.v1.DatasetVersion", $"{dataset}@{number}", message), Violations(field, message));
    }

    public static RpcException EntryNotFound(string dataset, long version, string entryId, string message, string field) =>
        Build(StatusCode.NotFound, message, ErrorReasons.EntryNotFound,
            Metadata(("dataset", dataset), ("version", version.ToString(System.Globalization.CultureInfo.InvariantCulture)), ("entry_id", entryId)),
            Resource("hull.v1.Entry", entryId, message), Violations(field, message));

    /// <summary>ALREADY_EXISTS; <paramref name="resourceType"/> and <paramref name="resourceName"/> fill the ResourceInfo.</summary>
    public static RpcException AlreadyExists(string message, string? field = null, ErrorReason? reason = null,
        string resourceType = "", string resourceName = "") =>
        Build(StatusCode.AlreadyExists, message, reason, Metadata(), Resource(resourceType, resourceName, message), Violations(field, message));

    /// <summary>
    /// FAILED_PRECONDITION with a PreconditionFailure whose type is the reason code and whose subject says what the
    /// precondition is about (e.g. "element:Fe" or "entry:fe-1"; may be empty).
    /// </summary>
    public static RpcException FailedPrecondition(string message, ErrorReason? reason = null, string subject = "",
        IReadOnlyList<FieldViolation>? violations = null)
    {
        ErrorReason chosen = reason ?? ErrorReasons.PreconditionFailed;
        var failure = new PreconditionFailure();
        failure.Violations.Add(new PreconditionFailure.Types.Violation { Type = chosen.Code, Subject = subject, Description = message });
        return Build(StatusCode.FailedPrecondition, message, chosen, Metadata(), failure, Violations(violations));
    }

    public static RpcException MissingElementalReference(string element, string message, IReadOnlyList<FieldViolation>? violations = null)
    {
        var failure = new PreconditionFailure();
        failure.Violations.Add(new PreconditionFailure.Types.Violation
        {
            Type = ErrorReasons.MissingElementalReference.Code, Subject = $"element:{element}", Description = message,
        });
        return Build(StatusCode.FailedPrecondition, message, ErrorReasons.MissingElementalReference, Metadata(("element", element)),
            failure, Violations(violations));
    }

    /// <summary>
    /// RESOURCE_EXHAUSTED past a documented limit. Prefer <see cref="LimitExceeded"/>, which names the limit; without
    /// it the QuotaFailure subject is the field, or "request".
    /// </summary>
    public static RpcException ResourceExhausted(string message, string? field = null) =>
        Build(StatusCode.ResourceExhausted, message, ErrorReasons.LimitExceeded, Metadata(),
            Quota(field ?? "request", message), Violations(field, message));

    /// <summary>
    /// RESOURCE_EXHAUSTED past one limit of <c>ServerLimits</c>: <paramref name="limit"/> is its field name (e.g.
    /// "max_entries_per_system"), <paramref name="limitValue"/> its value on this server.
    /// </summary>
    public static RpcException LimitExceeded(string limit, long limitValue, string message, IReadOnlyList<FieldViolation>? violations = null) =>
        Build(StatusCode.ResourceExhausted, message, ErrorReasons.LimitExceeded,
            Metadata(("limit", limit), ("limit_value", limitValue.ToString(System.Globalization.CultureInfo.InvariantCulture))),
            Quota(limit, message), Violations(violations));

    public static RpcException Plain(StatusCode code, string message, ErrorReason? reason = null, params (string Key, string Value)[] metadata) =>
        Build(code, message, reason, Metadata(metadata));

    public static RpcException WithViolations(StatusCode code, string message, IReadOnlyList<FieldViolation> violations, ErrorReason? reason = null) =>
        Build(code, message, reason, Metadata(), Violations(violations));

    /// <summary>
    /// The one place a status is made: ErrorInfo first (the reason, or the status's general one), then the other
    /// details that are present.
    /// </summary>
    public static RpcException Build(StatusCode code, string message, ErrorReason? reason, IReadOnlyDictionary<string, string> metadata,
        params IMessage?[] details)
    {
        ErrorReason chosen = reason ?? ErrorReasons.DefaultFor(code);
        if (chosen.Status != code)
        {
            throw new ArgumentException($"reason {chosen.Code} belongs to {chosen.Status}, not {code}", nameof(reason));
        }

        var status = new Google.Rpc.Status { Code = (int)code, Message = message };
        var info = new ErrorInfo { Reason = chosen.Code, Domain = ErrorReasons.Domain };
        foreach ((string key, string value) in metadata) info.Metadata[key] = value;
        status.Details.Add(Any.Pack(info));
        foreach (IMessage? detail in details)
        {
            if (detail is not null) status.Details.Add(Any.Pack(detail));
        }

        if (FittingDetailMissing(code, chosen, message, details) is { } fitting) status.Details.Add(Any.Pack(fitting));
        return status.ToRpcException();
    }

    /// <summary>
    /// <paramref name="error"/> as it is when it carries an ErrorInfo; otherwise the same status and message with the
    /// status's general reason added in front of any details it had (errors raised without these factories).
    /// </summary>
    public static RpcException WithErrorInfo(RpcException error)
    {
        Google.Rpc.Status? given = error.GetRpcStatus();
        if (given?.GetDetail<ErrorInfo>() is not null) return error;

        var status = new Google.Rpc.Status { Code = (int)error.StatusCode, Message = error.Status.Detail };
        status.Details.Add(Any.Pack(new ErrorInfo { Reason = ErrorReasons.DefaultFor(error.StatusCode).Code, Domain = ErrorReasons.Domain }));
        if (given is not null) status.Details.Add(given.Details);
        return status.ToRpcException();
    }

    // A status raised through a general factory (WithViolations, Plain) still gets the detail that fits it.
    private static IMessage? FittingDetailMissing(StatusCode code, ErrorReason reason, string message, IMessage?[] details) => code switch
    {
        StatusCode.NotFound or StatusCode.AlreadyExists when !details.OfType<ResourceInfo>().Any() =>
            Resource(string.Empty, string.Empty, message),
        StatusCode.FailedPrecondition when !details.OfType<PreconditionFailure>().Any() =>
            new PreconditionFailure { Violations = { new PreconditionFailure.Types.Violation { Type = reason.Code, Description = message } } },
        StatusCode.ResourceExhausted when !details.OfType<QuotaFailure>().Any() => Quota("request", message),
        _ => null,
    };

    private static IReadOnlyDictionary<string, string> Metadata(params (string Key, string Value)[] pairs) =>
        pairs.ToDictionary(p => p.Key, p => p.Value, StringComparer.Ordinal);

    private static ResourceInfo Resource(string type, string name, string description) =>
        new() { ResourceType = type, ResourceName = name, Description = description };

    private static QuotaFailure Quota(string subject, string description)
    {
        var quota = new QuotaFailure();
        quota.Violations.Add(new QuotaFailure.Types.Violation { Subject = subject, Description = description });
        return quota;
    }

    private static BadRequest? Violations(string? field, string description) =>
        field is null ? null : Violations([new FieldViolation(field, description)]);

    private static BadRequest? Violations(IReadOnlyList<FieldViolation>? violations)
    {
        if (violations is null || violations.Count == 0) return null;
        var badRequest = new BadRequest();
        foreach (FieldViolation v in violations.Take(MaxViolationsReported))
        {
            badRequest.FieldViolations.Add(new BadRequest.Types.FieldViolation { Field = v.Field, Description = v.Description });
        }

        return badRequest;
    }
}
