using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// A point of a hull: an entry, or a synthetic elemental reference at formation energy 0 that stands in for an
/// element without entries (its id is the element symbol and <see cref="IsSynthetic"/> is true).
/// </summary>
public sealed class HullPhase
{
    internal HullPhase(string id, bool isSynthetic, Composition composition, double formationEnergyEvPerAtom)
    {
        Id = id;
        IsSynthetic = isSynthetic;
        Composition = composition;
        FormationEnergyEvPerAtom = formationEnergyEvPerAtom;
    }

    /// <summary>The entry id, or the element symbol for a synthetic reference.</summary>
    public string Id { get; }

    /// <summary>True for a synthetic elemental reference that is not one of the entries.</summary>
    public bool IsSynthetic { get; }

    /// <summary>Composition as written (one atom for a synthetic reference).</summary>
    public Composition Composition { get; }

    /// <summary>Formation energy from the elements (eV/atom).</summary>
    public double FormationEnergyEvPerAtom { get; }

    public override string ToString() => IsSynthetic ? $"{Id} (reference)" : Id;
}
