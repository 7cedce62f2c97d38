using Hull.Core.Thermo;

namespace Hull.Server.Curation;

/// <summary>What every step of a run may know of the source version, fixed before the first step runs.</summary>
/// <param name="SourceReferences">The elemental references of the source version's hulls: per element, the lowest
/// total energy per atom of its pure-element total-energy entries (the default rule of <see cref="FormationEnergies"/>).</param>
public sealed record CurationContext(ElementalReferences SourceReferences)
{
    /// <summary>The context of a source version, from all of its entries.</summary>
    public static CurationContext Of(IReadOnlyList<CurationEntry> sourceEntries)
    {
        FormationEnergySet set = FormationEnergies.Evaluate(sourceEntries.Select(e => e.Phase).ToList());
        return new CurationContext(new ElementalReferences(set.References.Select(r => KeyValuePair.Create(r.Symbol, r.TotalEnergyEvPerAtom))));
    }
}
