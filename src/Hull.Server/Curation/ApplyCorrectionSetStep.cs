using System.Globalization;
using System.Text.Json.Nodes;
using Hull.Core.Thermo;
using Hull.Core.Thermo.Corrections;
using Hull.Server.Corrections;

namespace Hull.Server.Curation;

/// <summary>
/// Applies a stored correction set (named by <c>set_name</c> and <c>set_version</c>) to the entries before this step,
/// as DeriveCorrectedVersion applies one to a whole version: later steps see the corrected energies, and the derived
/// version records the set, so every answer on it names it. A recipe applies at most one set, since a version records
/// one. From here on total energies are measured from the corrected entries' own elemental references (a fitted
/// reference moves them), each element without a pure-element total-energy entry left keeping the reference it had.
/// </summary>
public sealed class ApplyCorrectionSetStep(int stepNumber, string setName, long setVersion) : ICurationStep
{
    public const string KindName = "apply_correction_set";

    /// <summary>The step's place in its recipe, from 1: refusals that only running finds name it.</summary>
    public int StepNumber { get; } = stepNumber;

    public string SetName { get; } = setName;

    public long SetVersion { get; } = setVersion;

    public string Kind => KindName;

    /// <summary>"name v3", as answers name the set.</summary>
    public string Label => string.Create(CultureInfo.InvariantCulture, $"{SetName} v{SetVersion}");

    public static ApplyCorrectionSetStep Read(StepParameters p)
    {
        string name = p.Text("set_name");
        double version = p.Number("set_version");
        if (version < 1 || version != Math.Floor(version) || version > long.MaxValue / 2)
        {
            throw p.Error("set_version", $"must be a whole number from 1, not {version.ToString(CultureInfo.InvariantCulture)}");
        }

        return new ApplyCorrectionSetStep(p.StepNumber, name, (long)version);
    }

    public JsonObject Parameters() => new() { ["set_name"] = SetName, ["set_version"] = SetVersion };

    /// <exception cref="CurationRecipeException">The set does not fit the entries, or a corrected energy leaves the
    /// formation-energy range (the entry named).</exception>
    public CurationStepOutcome Apply(IReadOnlyList<CurationEntry> entries, CurationContext context)
    {
        CorrectionSet set = context.Corrections is { } given && given.Name == SetName && given.Version == SetVersion
            ? given
            : throw new InvalidOperationException($"the correction set {Label} of recipe step {StepNumber} was not loaded before the run");
        if (entries.Count == 0) return new(entries);
        CorrectedRows corrected;
        try
        {
            corrected = CorrectedRows.Apply(entries.Select(e => e.Row).ToList(), set);
        }
        catch (ThermoInputException e)
        {
            throw new CurationRecipeException(StepNumber, "set_name", $"correction set '{set.Label}' cannot be applied: {e.Message}");
        }

        if (corrected.RangeProblems().FirstOrDefault() is { EntryId: not null } problem)
        {
            throw new CurationRecipeException(StepNumber, "set_name", $"entry '{problem.EntryId}' after correction with '{set.Label}': {problem.Problem}");
        }

        var next = new CurationEntry[entries.Count];
        for (int i = 0; i < entries.Count; i++)
        {
            next[i] = corrected.Outcome.Entries[i].IsChanged ? CurationEntry.Read(corrected.Rows[i]) : entries[i];
        }

        return new(next, corrected.Outcome.ChangedCount, context.WithReferencesOf(next));
    }
}
