namespace Hull.Store;

/// <summary>
/// The free-energy anchor tokens the store's file accepts (the CHECK on entry_temperature_models.free_energy_anchor
/// in migration 5, which is never edited). The store keeps the token it is given and does not interpret it.
/// </summary>
public static class StoredFreeEnergyAnchorTokens
{
    /// <summary>Every accepted token, in the order migration 5 lists them.</summary>
    public static IReadOnlyList<string> All { get; } = ["computed_0k", "fitted_298k"];

    /// <summary>Whether the store accepts <paramref name="token"/> (exact, case-sensitive).</summary>
    public static bool IsAccepted(string? token) => token is not null && All.Contains(token, StringComparer.Ordinal);
}
