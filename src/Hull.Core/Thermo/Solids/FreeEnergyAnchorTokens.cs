namespace Hull.Core.Thermo.Solids;

/// <summary>
/// The text names of the free-energy anchors: what entry files write, what the store keeps and what the wire enum's
/// value names say in lower case without their prefix. They are persisted, so they never change.
/// </summary>
public static class FreeEnergyAnchorTokens
{
    public const string Computed0K = "computed_0k";
    public const string Fitted298K = "fitted_298k";

    /// <summary>Every anchor, in declaration order.</summary>
    public static IReadOnlyList<FreeEnergyAnchor> All { get; } = [FreeEnergyAnchor.Computed0K, FreeEnergyAnchor.Fitted298K];

    /// <summary>The token of an anchor.</summary>
    /// <exception cref="ArgumentOutOfRangeException">For a value outside the enum.</exception>
    public static string ToToken(FreeEnergyAnchor anchor) => anchor switch
    {
        FreeEnergyAnchor.Computed0K => Computed0K,
        FreeEnergyAnchor.Fitted298K => Fitted298K,
        _ => throw new ArgumentOutOfRangeException(nameof(anchor), anchor, "not a defined free-energy anchor"),
    };

    /// <summary>Reads a token (exact, case-sensitive); false for anything else.</summary>
    public static bool TryParse(string? token, out FreeEnergyAnchor anchor)
    {
        switch (token)
        {
            case Computed0K: anchor = FreeEnergyAnchor.Computed0K; return true;
            case Fitted298K: anchor = FreeEnergyAnchor.Fitted298K; return true;
            default: anchor = default; return false;
        }
    }
}
