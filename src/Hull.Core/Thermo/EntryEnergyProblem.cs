namespace Hull.Core.Thermo;

/// <summary>Why an entry's formation energy cannot be used in a hull.</summary>
public enum EntryEnergyProblemKind
{
    /// <summary>A total energy with an element that has neither a pure-element total-energy entry nor an explicit reference.</summary>
    MissingReference,

    /// <summary>The formation energy (given, or implied by a total energy and the references) is outside <see cref="FormationEnergyRange"/>.</summary>
    OutOfRange,
}

/// <summary>One entry whose formation energy cannot be used, and why (the message names the entry and the element or value).</summary>
public sealed record EntryEnergyProblem(string EntryId, int RowIndex, EntryEnergyProblemKind Kind, string? Element, string Message);
