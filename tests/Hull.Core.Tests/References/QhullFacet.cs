namespace Hull.Core.Tests.References;

/// <summary>
/// A facet of a full convex hull as reported by qconvex: the input indices of its vertices and its outward unit
/// normal with offset (normal . p + offset = 0 on the facet, negative inside).
/// </summary>
public sealed record QhullFacet(int[] Vertices, double[] OutwardNormal, double Offset)
{
    /// <summary>
    /// For a facet of points lifted to (x_1, ..., x_{n-1}, E): the plane n . p + offset = 0 written as E = Σ_k mu_k x_k,
    /// with mu_n = −offset / n_E at the corner of the last component and mu_k = −(offset + n_k) / n_E at the others
    /// (qconvex manual, 'n'). Meaningful for lower facets (n_E &lt; 0).
    /// </summary>
    public double[] ChemicalPotentials()
    {
        int components = OutwardNormal.Length;
        double nE = OutwardNormal[^1];
        return Enumerable.Range(0, components).Select(k => k == components - 1 ? -Offset / nE : -(Offset + OutwardNormal[k]) / nE).ToArray();
    }
}
