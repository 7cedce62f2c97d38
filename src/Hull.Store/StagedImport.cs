namespace Hull.Store;

/// <summary>An open import session and every row staged in it so far, in staging order.</summary>
/// <param name="Session">The session as it stood when the rows were read.</param>
/// <param name="Rows">The staged rows; <c>Rows.Count</c> equals <c>Session.StagedCount</c>.</param>
public sealed record StagedImport(ImportSessionInfo Session, IReadOnlyList<EntryRow> Rows);
