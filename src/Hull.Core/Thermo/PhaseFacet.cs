namespace Hull.Core.Thermo;

/// <summary>
/// A facet of the hull: the stable phases at its corners and the plane through them, written as chemical
/// potentials (eV per atom of each component, relative to the elemental references; for a hull over end-members,
/// per atom of each end-member) at which all of them coexist.
/// </summary>
public sealed class PhaseFacet
{
    internal PhaseFacet(
        IReadOnlyList<HullPhase> phases, IReadOnlyList<string> components, HullAxis axis, IReadOnlyList<double> chemicalPotentialsEvPerAtom)
    {
        Phases = phases;
        Axis = axis;
        Components = components;
        ChemicalPotentialsEvPerAtom = chemicalPotentialsEvPerAtom;
    }

    /// <summary>The corner phases, sorted by id.</summary>
    public IReadOnlyList<HullPhase> Phases { get; }

    /// <summary>The hull's energy axis (on an open-element hull, the potentials are those of the closed elements at the open ones' fixed values).</summary>
    public HullAxis Axis { get; }

    /// <summary>The hull's components, in the order of <see cref="ChemicalPotentialsEvPerAtom"/>.</summary>
    public IReadOnlyList<string> Components { get; }

    /// <summary>One chemical potential per component (eV/atom).</summary>
    public IReadOnlyList<double> ChemicalPotentialsEvPerAtom { get; }

    /// <summary>The chemical potential of one component (eV/atom).</summary>
    public double ChemicalPotentialOf(string component)
    {
        for (int k = 0; k < Components.Count; k++)
        {
            if (string.Equals(Components[k], component, StringComparison.Ordinal))
            {
                return ChemicalPotentialsEvPerAtom[k];
            }
        }

        throw new ArgumentException($"'{component}' is not a component of this hull ({string.Join("-", Components)}).", nameof(component));
    }
}
