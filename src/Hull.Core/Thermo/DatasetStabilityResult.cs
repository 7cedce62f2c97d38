namespace Hull.Core.Thermo;

/// <summary>Stability of every entry of a dataset, in input order, and the hulls that were built for it.</summary>
public sealed class DatasetStabilityResult
{
    internal DatasetStabilityResult(
        IReadOnlyList<EntryStability> entries, IReadOnlyList<string> hullSystems, IReadOnlyList<ElementReference> references)
    {
        Entries = entries;
        HullSystems = hullSystems;
        References = references;
    }

    /// <summary>The energy axis of every hull of the analysis: formation energy per atom.</summary>
    public HullAxis Axis => HullAxis.FormationEnergy;

    /// <summary>One result per entry, in the order the entries were given.</summary>
    public IReadOnlyList<EntryStability> Entries { get; }

    /// <summary>The chemical systems a hull was built for (the maximal ones), sorted by name.</summary>
    public IReadOnlyList<string> HullSystems { get; }

    /// <summary>The elemental references used for total energies, sorted by symbol.</summary>
    public IReadOnlyList<ElementReference> References { get; }
}
