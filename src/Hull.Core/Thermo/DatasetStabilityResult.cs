namespace Hull.Core.Thermo;

/// <summary>Stability of the entries of a dataset, the hulls that were built for it, and what could not be answered.</summary>
public sealed class DatasetStabilityResult
{
    internal DatasetStabilityResult(
        IReadOnlyList<EntryStability> entries,
        IReadOnlyList<string> hullSystems,
        IReadOnlyList<ElementReference> references,
        IReadOnlyList<SystemCoverage> coverage,
        IReadOnlyList<SystemProblem> problems)
    {
        Entries = entries;
        HullSystems = hullSystems;
        References = references;
        Coverage = coverage;
        Problems = problems;
    }

    /// <summary>The energy axis of every hull of the analysis: formation energy per atom.</summary>
    public HullAxis Axis => HullAxis.FormationEnergy;

    /// <summary>
    /// One result per answered entry, in the order the entries were given (each says its row); every entry when
    /// <see cref="Problems"/> is empty.
    /// </summary>
    public IReadOnlyList<EntryStability> Entries { get; }

    /// <summary>The chemical systems a hull was built for (the maximal ones), sorted by name.</summary>
    public IReadOnlyList<string> HullSystems { get; }

    /// <summary>The elemental references used for total energies, sorted by symbol.</summary>
    public IReadOnlyList<ElementReference> References { get; }

    /// <summary>The coverage of each hull system, sorted by name (one per <see cref="HullSystems"/> entry).</summary>
    public IReadOnlyList<SystemCoverage> Coverage { get; }

    /// <summary>Chemical systems that could not be analysed, sorted by name; their entries have no result.</summary>
    public IReadOnlyList<SystemProblem> Problems { get; }
}
