namespace Hull.Core.Defects;

/// <summary>
/// Defect-study input that cannot be used: the message says what is wrong; <see cref="Field"/> names where
/// (e.g. <c>defects[2].charge_states[1].energy_ev</c>) so the server can answer with a field violation.
/// </summary>
public sealed class DefectInputException : ArgumentException
{
    public DefectInputException(string field, string message)
        : base($"{field}: {message}")
    {
        Field = field;
        Reason = message;
    }

    /// <summary>Path of the offending field in the study.</summary>
    public string Field { get; }

    /// <summary>The message without the field prefix.</summary>
    public string Reason { get; }
}
