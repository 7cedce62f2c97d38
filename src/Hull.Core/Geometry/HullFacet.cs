namespace Hull.Core.Geometry;

/// <summary>
/// A lower facet of the hull: one vertex point per component, and the plane through them written as chemical
/// potentials, so that the hull energy at fractions x inside the facet is sum_k mu_k x_k (eV/atom).
/// </summary>
public sealed class HullFacet
{
    internal HullFacet(int[] vertexPoints, double[] chemicalPotentialsEvPerAtom)
    {
        VertexPoints = Array.AsReadOnly(vertexPoints);
        ChemicalPotentialsEvPerAtom = Array.AsReadOnly(chemicalPotentialsEvPerAtom);
    }

    /// <summary>Input point indices of the facet's vertices.</summary>
    public IReadOnlyList<int> VertexPoints { get; }

    /// <summary>Chemical potential of each component on this facet, eV per atom of that component.</summary>
    public IReadOnlyList<double> ChemicalPotentialsEvPerAtom { get; }
}
