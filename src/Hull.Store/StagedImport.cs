namespace Hull.Store;

/// <summary>An open import session and rows staged in it so far (all, or those asked for), in staging order.</summary>
/// <param name="Session">The session as it stood when the rows were read; its StagedCount counts every row.</param>
/// <param name="Rows">The rows read, each with its place in the whole session.</param>
public sealed record StagedImport(ImportSessionInfo Session, IReadOnlyList<StagedRow> Rows);
