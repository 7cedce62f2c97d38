namespace Hull.Core.Tests.References;

/// <summary>
/// Input of the LP references: points as integer amounts of each component with energies per atom (eV/atom),
/// and the query compositions (fractions of each component, summing to 1) at which the hull energy is wanted.
/// Optionally, per query, the points that query's LP may not use (the hull of all the other points is asked for);
/// null, or an empty list for a query, leaves every point in.
/// </summary>
public sealed record HullLpProblem(
    IReadOnlyList<long[]> Amounts,
    IReadOnlyList<double> EnergiesEvPerAtom,
    IReadOnlyList<double[]> Queries,
    IReadOnlyList<int[]>? ExcludedPerQuery = null)
{
    public int ComponentCount => Amounts[0].Length;

    public bool HasExclusions => ExcludedPerQuery is not null && ExcludedPerQuery.Any(e => e.Length > 0);

    /// <summary>Points query q may not use (empty when none).</summary>
    public int[] Excluded(int q) => ExcludedPerQuery is null ? [] : ExcludedPerQuery[q];
}
