namespace Hull.Store.Sqlite;

/// <summary>One ordered step of the schema: run once, inside the transaction that records it in schema_version.</summary>
/// <param name="Version">The schema version this step produces (steps are numbered 1, 2, 3, ... without gaps).</param>
/// <param name="Description">What the step changes, recorded beside the version.</param>
/// <param name="Sql">The statements of the step.</param>
internal sealed record Migration(int Version, string Description, string Sql);
