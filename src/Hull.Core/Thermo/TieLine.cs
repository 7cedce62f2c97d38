namespace Hull.Core.Thermo;

/// <summary>Two stable phases that share a hull facet (they coexist); <see cref="First"/> sorts before <see cref="Second"/> by id.</summary>
public sealed record TieLine(HullPhase First, HullPhase Second)
{
    public override string ToString() => $"{First} - {Second}";
}
