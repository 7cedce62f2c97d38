namespace Hull.Server.Curation;

/// <summary>Every step kind a recipe may name, with the reader of its parameters. Adding a kind is one line here.</summary>
public static class CurationStepKinds
{
    private static readonly Dictionary<string, Func<StepParameters, ICurationStep>> Readers = new(StringComparer.Ordinal)
    {
        [DropFlaggedStep.KindName] = DropFlaggedStep.Read,
        [EnergyRangeStep.KindName] = EnergyRangeStep.Read,
        [KeepLowestDuplicateStep.KindName] = KeepLowestDuplicateStep.Read,
        [DropSourceStep.KindName] = DropSourceStep.Read,
        [DropAboveHullStep.KindName] = DropAboveHullStep.Read,
        [KeepElementsStep.KindName] = KeepElementsStep.Read,
    };

    /// <summary>The kinds known, sorted, for error messages and help.</summary>
    public static IReadOnlyList<string> Names { get; } = Readers.Keys.Order(StringComparer.Ordinal).ToList();

    /// <exception cref="CurationRecipeException">An unknown kind, or a faulty parameter of a known one.</exception>
    public static ICurationStep Read(string kind, StepParameters parameters)
    {
        if (!Readers.TryGetValue(kind, out Func<StepParameters, ICurationStep>? reader))
        {
            throw parameters.Error("kind", $"'{kind}' is not a step kind (known: {string.Join(", ", Names)})");
        }
        ICurationStep step = reader(parameters);
        parameters.RequireAllRead();
        return step;
    }
}
