using Grpc.Core;
using Hull.Core.Thermo;
using Hull.Store;

namespace Hull.Server.Errors;

/// <summary>
/// Turns the errors of the store and the science layer into gRPC statuses with their reason codes, so that every
/// service method answers the same fault the same way. Anything else is a bug and stays an exception (logged,
/// INTERNAL to the caller).
/// </summary>
public static class StoreErrorTranslation
{
    /// <summary>The gRPC error for <paramref name="error"/>, or null when it is not a known caller or data fault.</summary>
    /// <param name="error">The exception raised below the service.</param>
    /// <param name="datasetField">Request field that named the dataset ("dataset" or "name").</param>
    public static RpcException? Translate(Exception error, string datasetField = "dataset") => error switch
    {
        RpcException => null,
        InvalidDatasetNameException e => RpcErrors.InvalidArgument(datasetField, e.Message, ErrorReasons.InvalidDatasetName),
        DatasetNotFoundException e => RpcErrors.DatasetNotFound(e.DatasetName, e.Message, datasetField),
        VersionNotFoundException e => RpcErrors.VersionNotFound(e.DatasetName, e.Version, e.Message),
        DatasetAlreadyExistsException e =>
            RpcErrors.AlreadyExists(e.Message, datasetField, ErrorReasons.DatasetExists, "hull.v1.Dataset", e.DatasetName),
        DuplicateEntryException { ExistingVersion: not null } e => RpcErrors.EntryIdExists(e.EntryId ?? string.Empty,
            e.Message + "; choose the replace duplicate policy to supersede it", RowField(e), WithoutRowPrefix(e)),
        ImportSessionNotFoundException e => RpcErrors.ImportSessionNotFound(e.SessionId, e.Expired, e.Message),
        CorrectionSetNotFoundException e => RpcErrors.NotFound(e.Message, "name", ErrorReasons.ResourceNotFound),
        CorrectionSetConflictException e => RpcErrors.AlreadyExists(e.Message, "set_json", ErrorReasons.ResourceExists,
            "hull.v1.CorrectionSet", $"{e.SetName} v{e.SetVersion}"),
        BaseVersionChangedException e => RpcErrors.Plain(StatusCode.Aborted, e.Message + "; retry", ErrorReasons.DatasetMoved),
        StoreUnavailableException e => RpcErrors.Plain(StatusCode.Unavailable, e.Message, ErrorReasons.StoreUnavailable),
        ImportSessionChangedException e => RpcErrors.FailedPrecondition(e.Message, subject: $"import_session:{e.SessionId}"),
        InvalidBatchException e => e.RowIndex is null
            ? RpcErrors.InvalidArgument("entries", e.Message, ErrorReasons.InvalidEntry)
            : RpcErrors.InvalidArgument(e.Message, [new FieldViolation(RowField(e), e.Message)], ErrorReasons.InvalidEntry),
        ThermoInputException { IsMissingReference: true, Element: { } element } e =>
            RpcErrors.MissingElementalReference(element, "the dataset version cannot be analysed: " + e.Message),
        ThermoInputException e => RpcErrors.FailedPrecondition(
            "the dataset version cannot be analysed: " + e.Message + (e.Element is null ? string.Empty : $" (element {e.Element})"),
            ErrorReasons.DatasetNotAnalysable,
            e.EntryId is null ? (e.Element is null ? string.Empty : $"element:{e.Element}") : $"entry:{e.EntryId}"),
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
            nameof(EntryRow.TemperatureModel) => "temperature_model",
            _ => string.Empty,
        };
        return field.Length == 0 ? $"entries[{e.RowIndex}]" : $"entries[{e.RowIndex}].{field}";
    }
}
