namespace Hull.Server.Corrections;

/// <summary>A correction-set document that cannot be read: names the field at fault as a path ("method_rules[1].align_on").</summary>
public sealed class CorrectionSetDocumentException(string field, string problem) : Exception($"correction set field '{field}': {problem}")
{
    /// <summary>The field at fault, a path into the document; "(document)" for the whole.</summary>
    public string Field { get; } = field;
}
