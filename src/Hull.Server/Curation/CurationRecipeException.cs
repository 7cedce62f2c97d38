namespace Hull.Server.Curation;

/// <summary>A recipe that cannot be run: names the 1-based step (0 for the recipe itself) and the field at fault.</summary>
public sealed class CurationRecipeException : Exception
{
    public CurationRecipeException(int stepNumber, string field, string problem)
        : base(stepNumber == 0 ? $"recipe field '{field}': {problem}" : $"recipe step {stepNumber}, field '{field}': {problem}")
    {
        StepNumber = stepNumber;
        Field = field;
    }

    /// <summary>The 1-based step at fault; 0 when the recipe's own fields are.</summary>
    public int StepNumber { get; }

    /// <summary>The field at fault, e.g. "max_ev_per_atom".</summary>
    public string Field { get; }
}
