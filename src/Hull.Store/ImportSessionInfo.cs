namespace Hull.Store;

/// <summary>An open import session: batches staged so far, and when it lapses if nothing more arrives.</summary>
/// <param name="SessionId">The id the caller names in every later call (32 hex digits, unguessable).</param>
/// <param name="DatasetName">The dataset the commit writes to.</param>
/// <param name="Policy">What the commit does with ids the latest version already has.</param>
/// <param name="StagedCount">Rows staged so far.</param>
/// <param name="ExpiresAtUtc">Without a further call by then, the session and its staged rows are removed.</param>
public sealed record ImportSessionInfo(string SessionId, string DatasetName, DuplicatePolicy Policy, long StagedCount, DateTimeOffset ExpiresAtUtc);
