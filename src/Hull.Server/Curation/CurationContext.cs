using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;

namespace Hull.Server.Curation;

/// <summary>What every step of a run may know of the source version, fixed before the first step runs.</summary>
/// <param name="SourceReferences">The elemental references of the source version's hulls: per element, the lowest
/// total energy per atom of its pure-element total-energy entries (the default rule of <see cref="FormationEnergies"/>).</param>
/// <param name="Corrections">The correction set the recipe's apply_correction_set step names, read from the store
/// before the run; null when the recipe applies none.</param>
public sealed record CurationContext(ElementalReferences SourceReferences, CorrectionSet? Corrections = null)
{
    /// <summary>The context of a source version, from all of its entries.</summary>
    public static CurationContext Of(IReadOnlyList<CurationEntry> sourceEntries, CorrectionSet? corrections = null) =>
        new(ReferencesOf(sourceEntries), corrections);

    /// <summary>
    /// This context with the references of <paramref name="entries"/> (after a step that moved energies), each element
    /// they give no reference for keeping the one it had.
    /// </summary>
    public CurationContext WithReferencesOf(IReadOnlyList<CurationEntry> entries)
    {
        ElementalReferences own = ReferencesOf(entries);
        var merged = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (string symbol in SourceReferences.Symbols)
        {
            if (SourceReferences.TryGetEvPerAtom(symbol, out double ev)) merged[symbol] = ev;
        }

        foreach (string symbol in own.Symbols)
        {
            if (own.TryGetEvPerAtom(symbol, out double ev)) merged[symbol] = ev;
        }

        return this with { SourceReferences = new ElementalReferences(merged) };
    }

    private static ElementalReferences ReferencesOf(IReadOnlyList<CurationEntry> entries)
    {
        FormationEnergySet set = FormationEnergies.Evaluate(entries.Select(e => e.Phase).ToList());
        return new ElementalReferences(set.References.Select(r => KeyValuePair.Create(r.Symbol, r.TotalEnergyEvPerAtom)));
    }
}
