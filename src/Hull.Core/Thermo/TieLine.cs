namespace Hull.Core.Thermo;

/// <summary>
/// Two stable phases that coexist: corners of one face of the hull (a facet, or facets exactly on one plane);
/// <see cref="First"/> sorts before <see cref="Second"/> by id.
/// </summary>
public sealed record TieLine(HullPhase First, HullPhase Second)
{
    public override string ToString() => $"{First} - {Second}";
}
