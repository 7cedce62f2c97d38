namespace Hull.Core.Geometry;

/// <summary>
/// When the incremental hull gives up (see <see cref="HullStability"/>): more facets made per point added than
/// <see cref="FacetsPerPointAdded"/> (counting at least <see cref="LowerHullBuilder.JudgeRateFromPoints"/> points), or
/// more than <see cref="TotalFacets"/> facets made in all.
/// </summary>
internal readonly record struct FacetLimits(double FacetsPerPointAdded, double TotalFacets)
{
    public static readonly FacetLimits None = new(double.PositiveInfinity, double.PositiveInfinity);

    /// <summary>The same rate, with the facets already made by earlier constructions taken off the total.</summary>
    public FacetLimits After(long facetsMade) => this with { TotalFacets = TotalFacets - facetsMade };
}
