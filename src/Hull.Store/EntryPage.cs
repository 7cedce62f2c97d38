namespace Hull.Store;

/// <summary>One page of a version's entries, ordered by id (see <see cref="EntryIdOrder"/>).</summary>
/// <param name="Version">The version read; pass it back with <paramref name="NextAfterId"/> to read the next page of the same version.</param>
/// <param name="Entries">The entries of this page.</param>
/// <param name="NextAfterId">The id to continue after, or null when this page is the last.</param>
public sealed record EntryPage(long Version, IReadOnlyList<EntryRow> Entries, string? NextAfterId);
