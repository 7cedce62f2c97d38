namespace Hull.Core.Tests.References;

/// <summary>
/// A facet of a full convex hull as reported by qconvex: the input indices of its vertices and its outward unit
/// normal with offset (normal . p + offset = 0 on the facet, negative inside).
/// </summary>
public sealed record QhullFacet(int[] Vertices, double[] OutwardNormal, double Offset);
