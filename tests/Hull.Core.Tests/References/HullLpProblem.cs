namespace Hull.Core.Tests.References;

/// <summary>
/// Input of the LP references: points as integer amounts of each component with energies per atom (eV/atom),
/// and the query compositions (fractions of each component, summing to 1) at which the hull energy is wanted.
/// </summary>
public sealed record HullLpProblem(IReadOnlyList<long[]> Amounts, IReadOnlyList<double> EnergiesEvPerAtom, IReadOnlyList<double[]> Queries)
{
    public int ComponentCount => Amounts[0].Length;
}
