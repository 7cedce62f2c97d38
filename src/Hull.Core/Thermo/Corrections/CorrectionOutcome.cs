namespace Hull.Core.Thermo.Corrections;

/// <summary>A correction set applied to entries: every entry with its shift, and the corrected entries on a hull axis.</summary>
public sealed class CorrectionOutcome
{
    internal CorrectionOutcome(CorrectionSet set, IReadOnlyList<CorrectedEntry> entries)
    {
        Set = set;
        Entries = entries;
        CorrectedEntries = entries.Select(e => e.Corrected).ToArray();
        ChangedCount = entries.Count(e => e.IsChanged);
    }

    public CorrectionSet Set { get; }

    /// <summary>Every entry, in the order given.</summary>
    public IReadOnlyList<CorrectedEntry> Entries { get; }

    /// <summary>The corrected entries, in the order given.</summary>
    public IReadOnlyList<PhaseEntry> CorrectedEntries { get; }

    /// <summary>How many entries a rule moved.</summary>
    public int ChangedCount { get; }

    /// <summary>The axis the corrected formation energies are hulled on, naming the set.</summary>
    public HullAxis Axis => HullAxis.CorrectedFormationEnergy(Set.Label);

    /// <summary>
    /// The corrected entries placed on <see cref="Axis"/>: formation energies per atom of the corrected energies,
    /// from the corrected elemental references (or <paramref name="references"/> where given).
    /// </summary>
    /// <exception cref="ThermoInputException">What <see cref="FormationEnergies.Compute"/> refuses.</exception>
    public IReadOnlyList<HullAxisEntry> OnAxis(ElementalReferences? references = null)
    {
        FormationEnergySet formation = FormationEnergies.Compute(CorrectedEntries, references);
        return CorrectedEntries.Select((e, i) => new HullAxisEntry(e, formation.FormationEnergiesEvPerAtom[i])).ToArray();
    }
}
