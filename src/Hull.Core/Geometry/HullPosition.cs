namespace Hull.Core.Geometry;

/// <summary>
/// Where a composition falls on the lower hull: the facet that contains it, the facet vertices it decomposes into
/// with their atom fractions (each positive, summing to 1; vertices of zero weight are left out), and the hull
/// energy there.
/// </summary>
public sealed class HullPosition
{
    internal HullPosition(int facetIndex, int[] vertexPoints, double[] atomFractions, double hullEnergyEvPerAtom)
    {
        FacetIndex = facetIndex;
        VertexPoints = Array.AsReadOnly(vertexPoints);
        AtomFractions = Array.AsReadOnly(atomFractions);
        HullEnergyEvPerAtom = hullEnergyEvPerAtom;
    }

    /// <summary>Index into <see cref="LowerHull.Facets"/>.</summary>
    public int FacetIndex { get; }

    /// <summary>Input point indices of the hull phases the composition decomposes into.</summary>
    public IReadOnlyList<int> VertexPoints { get; }

    /// <summary>Fraction of the atoms that goes into each phase of <see cref="VertexPoints"/>.</summary>
    public IReadOnlyList<double> AtomFractions { get; }

    /// <summary>Energy of the hull at this composition, eV/atom.</summary>
    public double HullEnergyEvPerAtom { get; }
}
