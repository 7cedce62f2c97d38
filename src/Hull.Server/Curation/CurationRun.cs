using Hull.Core.Thermo.Corrections;
using Hull.Store;

namespace Hull.Server.Curation;

/// <summary>The entries a recipe left from a version's rows, with one record per step.</summary>
public sealed record CurationRun(IReadOnlyList<EntryRow> Rows, IReadOnlyList<CurationStepRecord> Records)
{
    /// <summary>Runs every step in order over the rows of one source version (read once; nothing is written).</summary>
    /// <param name="recipe">The recipe.</param>
    /// <param name="rows">The source version's rows.</param>
    /// <param name="corrections">The set the recipe's apply_correction_set step names (<see cref="CurationRecipe.Corrections"/>),
    /// read from the store; null when it has none.</param>
    /// <exception cref="CurationRecipeException">A row whose formula or basis cannot be read (its id named), or a step
    /// that cannot run on these rows.</exception>
    public static CurationRun Apply(CurationRecipe recipe, IReadOnlyList<EntryRow> rows, CorrectionSet? corrections = null)
    {
        IReadOnlyList<CurationEntry> entries = rows.Select(CurationEntry.Read).ToList();
        CurationContext context = CurationContext.Of(entries, corrections);
        var records = new List<CurationStepRecord>(recipe.Steps.Count);
        for (int i = 0; i < recipe.Steps.Count; i++)
        {
            ICurationStep step = recipe.Steps[i];
            CurationStepOutcome outcome = step.Apply(entries, context);
            records.Add(new CurationStepRecord(i + 1, step.Kind, step.Parameters(), entries.Count, entries.Count - outcome.Entries.Count, outcome.Changed));
            entries = outcome.Entries;
            context = outcome.Context ?? context;
        }
        return new CurationRun(entries.Select(e => e.Row).ToList(), records);
    }
}
