namespace Hull.Store.Sqlite;

/// <summary>A datasets row as read inside one transaction.</summary>
internal sealed record DatasetRecord(long DatasetId, string Name, string Description, DateTimeOffset CreatedAtUtc, long LastVersionIssued);
