namespace Hull.Store;

/// <summary>
/// The energy-basis tokens the store's file accepts (the CHECK on entries.energy_basis in migration 1, which is
/// never edited). The store keeps the token it is given and does not interpret it; the server reads it.
/// </summary>
public static class StoredBasisTokens
{
    /// <summary>Every accepted token, in the order migration 1 lists them.</summary>
    public static IReadOnlyList<string> All { get; } =
        ["total_per_formula_unit", "total_per_atom", "formation_per_formula_unit", "formation_per_atom"];

    /// <summary>Whether the store accepts <paramref name="token"/> (exact, case-sensitive).</summary>
    public static bool IsAccepted(string? token) => token is not null && All.Contains(token, StringComparer.Ordinal);
}
