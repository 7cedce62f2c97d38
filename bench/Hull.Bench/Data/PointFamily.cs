namespace Hull.Bench.Data;

/// <summary>The bench's families of point sets of one chemical system, each a different shape of hull.</summary>
public enum PointFamily
{
    /// <summary>≤12-atom lattice on the convex background, Gaussian noise of 1 meV/atom: nearly every composition stable.</summary>
    Dense,

    /// <summary>≤12-atom lattice on the convex background, exponential offsets: a minority stable.</summary>
    Sparse,

    /// <summary>Independent small amounts of every component, random pair interactions: few stable among many multi-component entries (<see cref="PairInteractionGenerator"/>).</summary>
    Pair,

    /// <summary>A piecewise-planar surface with many entries exactly on it: many coplanar, on-hull non-vertices (<see cref="FacetedGenerator"/>).</summary>
    Faceted,
}

public static class PointFamilies
{
    public static readonly PointFamily[] All = Enum.GetValues<PointFamily>();

    public static string Token(this PointFamily family) => family.ToString().ToLowerInvariant();

    public static PointSet Generate(PointFamily family, int components, int entries, int seed) => family switch
    {
        PointFamily.Dense => LatticeGenerator.Generate(components, entries, LatticeGenerator.SmallCellMaxAtoms, EnergyDistribution.Dense, seed),
        PointFamily.Sparse => LatticeGenerator.Generate(components, entries, LatticeGenerator.SmallCellMaxAtoms, EnergyDistribution.Sparse, seed),
        PointFamily.Pair => PairInteractionGenerator.Generate(components, entries, seed),
        PointFamily.Faceted => FacetedGenerator.Generate(components, entries, seed),
        _ => throw new ArgumentOutOfRangeException(nameof(family)),
    };
}
