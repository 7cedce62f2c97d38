namespace Hull.Store;

/// <summary>One staged row and its 0-based place in the whole import session (<c>staged[Index]</c> in errors).</summary>
public sealed record StagedRow(int Index, EntryRow Row);
