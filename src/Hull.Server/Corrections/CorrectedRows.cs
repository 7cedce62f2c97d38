using Hull.Core.Chemistry;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using Hull.Server.Mapping;
using Hull.Server.Validation;
using Hull.Store;

namespace Hull.Server.Corrections;

/// <summary>
/// A correction set applied to a version's stored rows: the rows with their corrected energies (same order, ids,
/// formulas, bases, notes, models, uncertainties and method tags; a row no rule moves is the same row) and Core's
/// outcome with each entry's shift. Nothing is written: a curation step or <see cref="CorrectedVersionWriter"/> takes
/// the rows on from here.
/// </summary>
public sealed record CorrectedRows(IReadOnlyList<EntryRow> Rows, CorrectionOutcome Outcome)
{
    /// <exception cref="ThermoInputException">The set does not fit the rows (the element, method or entry named), or a
    /// corrected energy is not finite.</exception>
    public static CorrectedRows Apply(IReadOnlyList<EntryRow> rows, CorrectionSet set)
    {
        ArgumentNullException.ThrowIfNull(rows);
        ArgumentNullException.ThrowIfNull(set);
        // Stored rows were checked at import, so their formulas and bases read.
        PhaseEntry[] entries = rows.Select(r => new PhaseEntry(r.Id, Composition.Parse(r.Formula), r.EnergyEv, WireMapping.BasisOf(r))).ToArray();
        CorrectionOutcome outcome = EnergyCorrections.Apply(entries, rows.Select(r => r.Method).ToArray(), set);
        var corrected = new EntryRow[rows.Count];
        for (int i = 0; i < rows.Count; i++)
        {
            CorrectedEntry entry = outcome.Entries[i];
            corrected[i] = entry.IsChanged ? rows[i] with { EnergyEv = entry.Corrected.EnergyEv } : rows[i];
        }

        return new CorrectedRows(corrected, outcome);
    }

    /// <summary>The moved formation-energy entries whose corrected energy leaves the range every import is held to, in row order.</summary>
    public IEnumerable<(string EntryId, string Problem)> RangeProblems()
    {
        foreach (CorrectedEntry entry in Outcome.Entries)
        {
            if (!entry.IsChanged || entry.Raw.IsTotalEnergy) continue;
            if (BatchValidation.FormationRangeProblem(entry.Corrected.EnergyEv, entry.Corrected.Basis, entry.Corrected.Composition) is { } problem)
            {
                yield return (entry.Raw.Id, problem);
            }
        }
    }
}
