namespace Hull.Store;

/// <summary>The outcome of a committed import.</summary>
/// <param name="NewVersion">The dataset version the batch created.</param>
/// <param name="Inserted">Rows whose id was not in the previous latest version.</param>
/// <param name="Replaced">Rows that replaced an id of the previous latest version (always 0 under Reject).</param>
public sealed record ImportResult(long NewVersion, int Inserted, int Replaced);
