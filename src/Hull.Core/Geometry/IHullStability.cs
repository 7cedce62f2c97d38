namespace Hull.Core.Geometry;

/// <summary>
/// What both hull engines answer: the stable points, every point's energy above the hull, and the hull energy and
/// decomposition at any composition. <see cref="LowerHull"/> also has the facets.
/// </summary>
public interface IHullStability
{
    /// <summary>Number of components.</summary>
    int ComponentCount { get; }

    /// <summary>Number of input points.</summary>
    int PointCount { get; }

    /// <summary>Input indices of the points that are vertices of the lower hull, ascending.</summary>
    IReadOnlyList<int> VertexPoints { get; }

    /// <summary>Whether input point i is a vertex of the lower hull.</summary>
    bool IsVertex(int pointIndex);

    /// <summary>Energy above the hull of input point i, eV/atom: zero for points within tolerance of the hull.</summary>
    double EnergyAboveHullEvPerAtom(int pointIndex);

    /// <summary>
    /// The hull energy at point i's composition with every point of that composition left out (eV/atom), or null for
    /// a pure component; for a point on the hull, its energy minus this is its decomposition energy.
    /// </summary>
    double? HullEnergyWithoutCompositionEvPerAtom(int pointIndex);

    /// <summary>Hull energy and decomposition at the composition of input point i.</summary>
    HullPosition LocatePoint(int pointIndex);

    /// <summary>Hull energy and decomposition at composition fractions (non-negative, summing to 1).</summary>
    HullPosition Locate(ReadOnlySpan<double> fractions);

    /// <summary>
    /// The chemical potentials at composition fractions (non-negative, summing to 1): one per component, in eV per
    /// atom of that component on the energy axis of the hull (relative to the pure components' energies), those of
    /// a lower-hull facet that contains the composition, so that the hull energy there is Σ_k mu_k x_k. They are the
    /// dual solution of the hull program "lowest Σ w_j E_j with Σ w_j x_j = x, w ≥ 0".
    /// </summary>
    /// <remarks>
    /// Unique only inside a facet. Where several facets meet (on a tie-line or a face between them, at a hull
    /// vertex, on the boundary of the simplex) every facet there gives valid potentials and this returns one of
    /// them: for <see cref="LowerHull"/> the facet its walk reaches, for <see cref="LinearProgramHull"/> the plane
    /// of the final basis of its program. The set of all of them is the composition's chemical-potential window.
    /// </remarks>
    /// <exception cref="ArgumentException">Wrong length, negative or non-finite fractions, or a sum other than 1.</exception>
    double[] ChemicalPotentialsEvPerAtomAt(ReadOnlySpan<double> fractions);
}
