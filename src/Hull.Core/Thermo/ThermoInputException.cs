namespace Hull.Core.Thermo;

/// <summary>
/// Input to the thermodynamics layer that cannot be used: the message says what is wrong and where; the properties
/// carry the entry id, its row in the list given (when the input was a list) and the element concerned.
/// </summary>
public sealed class ThermoInputException : ArgumentException
{
    public ThermoInputException(string message, string? entryId = null, int? rowIndex = null, string? element = null, bool isMissingReference = false)
        : base(message)
    {
        EntryId = entryId;
        RowIndex = rowIndex;
        Element = element;
        IsMissingReference = isMissingReference;
    }

    /// <summary>True when a total energy needs the reference of <see cref="Element"/> and none was found or given.</summary>
    public bool IsMissingReference { get; }

    /// <summary>Id of the entry at fault, when one entry is.</summary>
    public string? EntryId { get; }

    /// <summary>Zero-based index of that entry in the list that was given, when the input was a list.</summary>
    public int? RowIndex { get; }

    /// <summary>The element concerned, when the problem is about one element.</summary>
    public string? Element { get; }
}
