namespace Hull.Core.Tests.References;

/// <summary>
/// An outside reference tool is missing, failed, timed out or printed something we cannot read. Reference checks
/// throw this instead of skipping: a check that cannot run is a failed check.
/// </summary>
public sealed class ReferenceToolException : Exception
{
    public ReferenceToolException(string message) : base(message) { }

    public ReferenceToolException(string message, Exception inner) : base(message, inner) { }
}
