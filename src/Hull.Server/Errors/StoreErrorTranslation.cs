using Grpc.Core;
using Hull.Core.Thermo;
using Hull.Store;

namespace Hull.Server.Errors;

/// <summary>
/// Turns the errors of the store and the science layer into gRPC statuses, so that every service method answers
/// the same fault the same way. Anything else is a bug and stays an exception (logged, INTERNAL to the caller).
/// </summary>
public static class StoreErrorTranslation
{
    /// <summary>The gRPC error for <paramref name="error"/>, or null when it is not a known caller or data fault.</summary>
    /// <param name="error">The exception raised below the service.</param>
    /// <param name="datasetField">Request field that named the dataset ("dataset" or "name").</param>
    public static RpcException? Translate(Exception error, string datasetField = "dataset") => error switch
    {
        RpcException => null,
        InvalidDatasetNameException e => RpcErrors.InvalidArgument(datasetField, e.Message),
        DatasetNotFoundException e => RpcErrors.NotFound(e.Message, datasetField),
        VersionNotFoundException e => RpcErrors.NotFound(e.Message, "version"),
        DatasetAlreadyExistsException e => RpcErrors.AlreadyExists(e.Message, datasetField),
        DuplicateEntryException { ExistingVersion: not null } e => RpcErrors.WithViolations(StatusCode.AlreadyExists,
            e.Message + "; choose the replace duplicate policy to supersede it", [new FieldViolation(RowField(e), WithoutRowPrefix(e))]),
        ImportSessionNotFoundException e => RpcErrors.NotFound(e.Message, "session_id"),
        InvalidBatchException e => e.RowIndex is null
            ? RpcErrors.InvalidArgument("entries", e.Message)
            : RpcErrors.InvalidArgument(e.Message, [new FieldViolation(RowField(e), e.Message)]),
        ThermoInputException e => RpcErrors.FailedPrecondition(
            "the dataset version cannot be analysed: " + e.Message
            + (e.Element is null ? string.Empty : $" (element {e.Element})")),
        _ => null,
    };

    /// <summary>The Store's message without its leading "row i: ", which the field path already says.</summary>
    private static string WithoutRowPrefix(InvalidBatchException e)
    {
        string prefix = $"row {e.RowIndex}: ";
        return e.Message.StartsWith(prefix, StringComparison.Ordinal) ? e.Message[prefix.Length..] : e.Message;
    }

    private static string RowField(InvalidBatchException e)
    {
        string field = e.Field switch
        {
            nameof(EntryRow.Id) => "id",
            nameof(EntryRow.Formula) => "formula",
            nameof(EntryRow.EnergyEv) => "energy_ev",
            nameof(EntryRow.Basis) => "basis",
            nameof(EntryRow.Metadata) => "note",
            _ => string.Empty,
        };
        return field.Length == 0 ? $"entries[{e.RowIndex}]" : $"entries[{e.RowIndex}].{field}";
    }
}
