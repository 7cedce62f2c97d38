using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>The stability of one entry against the hull of its chemical system.</summary>
public sealed class EntryStability
{
    internal EntryStability(
        PhaseEntry entry,
        int rowIndex,
        string hullSystem,
        HullAxis axis,
        double axisEnergyEvPerAtom,
        double? formationEnergyEvPerAtom,
        double? formationEnergyFromEndMembersEvPerAtom,
        IReadOnlyList<double> componentAtomFractions,
        double energyAboveHullEvPerAtom,
        bool isHullVertex,
        Decomposition decomposition,
        double? decompositionEnergyEvPerAtom)
    {
        Entry = entry;
        RowIndex = rowIndex;
        HullSystem = hullSystem;
        Axis = axis;
        AxisEnergyEvPerAtom = axisEnergyEvPerAtom;
        FormationEnergyEvPerAtom = formationEnergyEvPerAtom;
        FormationEnergyFromEndMembersEvPerAtom = formationEnergyFromEndMembersEvPerAtom;
        ComponentAtomFractions = componentAtomFractions;
        EnergyAboveHullEvPerAtom = energyAboveHullEvPerAtom;
        IsHullVertex = isHullVertex;
        Decomposition = decomposition;
        DecompositionEnergyEvPerAtom = decompositionEnergyEvPerAtom;
    }

    /// <summary>The entry.</summary>
    public PhaseEntry Entry { get; }

    /// <summary>The entry's id.</summary>
    public string Id => Entry.Id;

    /// <summary>The entry's composition as written.</summary>
    public Composition Composition => Entry.Composition;

    /// <summary>Zero-based index of the entry in the list that was analysed.</summary>
    public int RowIndex { get; }

    /// <summary>The hull that answered: its components joined by '-' (e.g. "Fe-O", or "LiCoO2-LiNiO2").</summary>
    public string HullSystem { get; }

    /// <summary>The energy axis of the hull that answered; every energy of this record but the formation energy is on it.</summary>
    public HullAxis Axis { get; }

    /// <summary>The entry's energy on the hull's axis (<see cref="HullAxis.Unit"/>).</summary>
    public double AxisEnergyEvPerAtom { get; }

    /// <summary>Formation energy from the elements (eV/atom); null where the axis energies were given without it.</summary>
    public double? FormationEnergyEvPerAtom { get; }

    /// <summary>
    /// For a hull over compound end-members: the axis energy relative to the end-members' hull corners (per atom);
    /// null for a hull over elements, where it equals <see cref="AxisEnergyEvPerAtom"/>.
    /// </summary>
    public double? FormationEnergyFromEndMembersEvPerAtom { get; }

    /// <summary>Atom fractions of the hull's components (elements, or end-members), in component order.</summary>
    public IReadOnlyList<double> ComponentAtomFractions { get; }

    /// <summary>Energy above the hull on its axis (per atom as the axis counts atoms), 0 on the hull.</summary>
    public double EnergyAboveHullEvPerAtom { get; }

    /// <summary>True when the entry lies on the hull (energy above hull 0, within the hull tolerance).</summary>
    public bool IsOnHull => EnergyAboveHullEvPerAtom == 0.0;

    /// <summary>
    /// True when the entry is a vertex of the hull, i.e. one of the stable phases. Of tied polymorphs only the one
    /// with the smallest id is a vertex; an entry lying exactly inside a facet is on the hull without being a vertex.
    /// </summary>
    public bool IsHullVertex { get; }

    /// <summary>The hull phases the entry decomposes into (for a vertex: itself).</summary>
    public Decomposition Decomposition { get; }

    /// <summary>
    /// For an entry on the hull: its energy minus the hull built without every entry of its reduced composition
    /// (eV/atom); negative for a vertex, 0 for an entry that only touches the hull. Null for entries above the hull
    /// and for pure components (elements, or end-members), which cannot be removed from their own hull.
    /// </summary>
    public double? DecompositionEnergyEvPerAtom { get; }
}
