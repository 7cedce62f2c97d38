using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// A point of a hull: an entry, or a synthetic elemental reference at energy 0 that stands in for an element
/// without entries (its id is the element symbol and <see cref="IsSynthetic"/> is true). Its energy is on the
/// hull's axis (<see cref="SystemHull.Axis"/>); the formation energy is carried beside it where known.
/// </summary>
public sealed class HullPhase
{
    internal HullPhase(string id, bool isSynthetic, Composition composition, double axisEnergyEvPerAtom, double? formationEnergyEvPerAtom)
    {
        Id = id;
        IsSynthetic = isSynthetic;
        Composition = composition;
        AxisEnergyEvPerAtom = axisEnergyEvPerAtom;
        FormationEnergyEvPerAtom = formationEnergyEvPerAtom;
    }

    /// <summary>The entry id, or the element symbol for a synthetic reference.</summary>
    public string Id { get; }

    /// <summary>True for a synthetic elemental reference that is not one of the entries.</summary>
    public bool IsSynthetic { get; }

    /// <summary>Composition as written (one atom for a synthetic reference).</summary>
    public Composition Composition { get; }

    /// <summary>The energy hulled over (eV per atom as the hull's axis counts atoms).</summary>
    public double AxisEnergyEvPerAtom { get; }

    /// <summary>Formation energy from the elements (eV/atom); null where the axis energies were given without it.</summary>
    public double? FormationEnergyEvPerAtom { get; }

    public override string ToString() => IsSynthetic ? $"{Id} (reference)" : Id;
}
