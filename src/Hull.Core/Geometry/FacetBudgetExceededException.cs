namespace Hull.Core.Geometry;

/// <summary>
/// The incremental hull stopped at one of its <see cref="FacetLimits"/>: the data make the facets explode, and the
/// engine choice hands the point set to the program engine instead. Never leaves the library.
/// </summary>
internal sealed class FacetBudgetExceededException(long facetsMade, long pointsAdded)
    : Exception($"The incremental hull stopped after making {facetsMade} facets for {pointsAdded} points added.");
