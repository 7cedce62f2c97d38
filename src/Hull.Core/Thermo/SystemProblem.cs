namespace Hull.Core.Thermo;

/// <summary>
/// A chemical system of a dataset that cannot be analysed: some of its entries have no usable formation energy (no
/// elemental reference for a total energy, or out of range). Every entry of this system or of a larger system that
/// contains it is left unanswered (its hull would need those entries); the rest of the dataset is answered as usual.
/// </summary>
public sealed class SystemProblem
{
    internal SystemProblem(string chemicalSystem, IReadOnlyList<EntryEnergyProblem> causes, IReadOnlyList<string> unansweredEntryIds)
    {
        ChemicalSystem = chemicalSystem;
        Causes = causes;
        UnansweredEntryIds = unansweredEntryIds;
        ElementsWithoutReference = causes
            .Where(c => c.Kind == EntryEnergyProblemKind.MissingReference && c.Element is not null)
            .Select(c => c.Element!)
            .Distinct()
            .Order(StringComparer.Ordinal)
            .ToArray();
        string ids = EntryList.Describe(causes.Select(c => (c.EntryId, c.RowIndex)).ToArray());
        string why = ElementsWithoutReference.Count > 0
            ? $"no elemental reference for {string.Join(", ", ElementsWithoutReference)} (needed by the total energies of {ids}); "
              + "add a pure-element entry with a total energy or give an explicit reference"
            : $"the formation energies of {ids} are outside ±{FormationEnergyRange.MaxMagnitudeEvPerAtom:0} eV/atom";
        Message = $"chemical system {chemicalSystem} cannot be analysed: {why}. {UnansweredEntryIds.Count} "
            + $"entr{(UnansweredEntryIds.Count == 1 ? "y" : "ies")} of {chemicalSystem} and of the systems containing it have no answer.";
    }

    /// <summary>The system of the unusable entries, elements joined by '-' in ordinal order.</summary>
    public string ChemicalSystem { get; }

    /// <summary>The entries whose formation energy cannot be used, in input order; the first says why.</summary>
    public IReadOnlyList<EntryEnergyProblem> Causes { get; }

    /// <summary>Elements that lack a reference, ordinal order; empty when the cause is a range.</summary>
    public IReadOnlyList<string> ElementsWithoutReference { get; }

    /// <summary>Ids of the entries left without an answer because of this system (the causes included), in input order.</summary>
    public IReadOnlyList<string> UnansweredEntryIds { get; }

    /// <summary>What is wrong and what to do, naming the system, the elements and the entries.</summary>
    public string Message { get; }
}
