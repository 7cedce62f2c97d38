namespace Hull.Core.Thermo;

/// <summary>
/// How well a hull's chemical system is covered by entries, so that a stability answer can be read as a screening
/// result or not: which components have an entry of their own (and so a computed corner), which stand at formation
/// energy 0 by definition, and how many compounds compete in the system.
/// </summary>
public sealed class SystemCoverage
{
    internal SystemCoverage(string hullSystem, IReadOnlyList<ComponentCoverage> components, int entryCount, int compoundEntryCount)
    {
        HullSystem = hullSystem;
        Components = components;
        EntryCount = entryCount;
        CompoundEntryCount = compoundEntryCount;
    }

    /// <summary>The hull's system, components joined by '-' (e.g. "O-Zr").</summary>
    public string HullSystem { get; }

    /// <summary>One per component, in hull order.</summary>
    public IReadOnlyList<ComponentCoverage> Components { get; }

    /// <summary>Entries in the hull (synthetic corners not counted).</summary>
    public int EntryCount { get; }

    /// <summary>
    /// Entries of more than one component: the competing phases a compound of the system is judged against. With
    /// none, an answer says only how a composition sits against its components.
    /// </summary>
    public int CompoundEntryCount { get; }

    /// <summary>Components without an entry of their own, whose corner is formation energy 0 by definition.</summary>
    public IEnumerable<string> ComponentsAtZeroByDefinition => Components.Where(c => c.IsZeroByDefinition).Select(c => c.Name);
}

/// <summary>One component of a hull's system: its pure entries and, for total energies, the reference used.</summary>
/// <param name="Name">Element symbol (or end-member formula).</param>
/// <param name="PureEntryCount">Entries of this component alone.</param>
/// <param name="Reference">The total-energy reference used for this element; null when no total energy in the hull needs one.</param>
public sealed record ComponentCoverage(string Name, int PureEntryCount, ElementReference? Reference)
{
    /// <summary>True when no entry of this component exists: its corner is the synthetic point at formation energy 0.</summary>
    public bool IsZeroByDefinition => PureEntryCount == 0;
}
