namespace Hull.Server.Curation;

/// <summary>Every step kind a recipe may name, with the reader of its parameters. Adding a kind is one line here.</summary>
public static class CurationStepKinds
{
    private static readonly Dictionary<string, (Func<StepParameters, ICurationStep> Read, string[] Fields)> Readers = new(StringComparer.Ordinal)
    {
        [DropFlaggedStep.KindName] = (DropFlaggedStep.Read, ["flag"]),
        [EnergyRangeStep.KindName] = (EnergyRangeStep.Read, ["min_ev_per_atom", "max_ev_per_atom"]),
        [KeepLowestDuplicateStep.KindName] = (KeepLowestDuplicateStep.Read, []),
        [DropSourceStep.KindName] = (DropSourceStep.Read, ["source"]),
        [DropAboveHullStep.KindName] = (DropAboveHullStep.Read, ["max_ev_per_atom"]),
        [KeepElementsStep.KindName] = (KeepElementsStep.Read, ["elements"]),
        [ApplyCorrectionSetStep.KindName] = (ApplyCorrectionSetStep.Read, ["set_name", "set_version"]),
    };

    /// <summary>The kinds known, sorted, for error messages and help.</summary>
    public static IReadOnlyList<string> Names { get; } = Readers.Keys.Order(StringComparer.Ordinal).ToList();

    /// <exception cref="CurationRecipeException">An unknown kind, or a faulty parameter of a known one.</exception>
    public static ICurationStep Read(string kind, StepParameters parameters)
    {
        if (!Readers.TryGetValue(kind, out var reader))
        {
            throw parameters.Error("kind", $"'{kind}' is not a step kind (known: {string.Join(", ", Names)})");
        }
        // A misspelt field is named before any read, so a required field it was meant to be is not blamed instead.
        parameters.RequireOnly(kind, reader.Fields);
        ICurationStep step = reader.Read(parameters);
        parameters.RequireAllRead();
        return step;
    }
}
