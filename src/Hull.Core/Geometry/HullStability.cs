namespace Hull.Core.Geometry;

/// <summary>Chooses the hull engine for a point set by its number of components.</summary>
public static class HullStability
{
    /// <summary>
    /// From this many components on, stability is computed by <see cref="LinearProgramHull"/>. The number of lower
    /// facets grows roughly as the point count to the power (components − 1) / 2, so in six components and more
    /// a few thousand points already give 1e5–1e6 facets, while one small program per composition stays
    /// proportional to the points. Below, the facets are few and the incremental hull is the faster engine
    /// (measured: bench/README.md).
    /// </summary>
    public const int LinearProgramFromComponents = 6;

    /// <summary>
    /// Builds the engine that suits the number of components. Same input, checks and tie rules as
    /// <see cref="LowerHull.Build"/>.
    /// </summary>
    public static IHullStability Build(IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom)
    {
        ArgumentNullException.ThrowIfNull(amounts);
        int components = amounts.Count > 0 ? amounts[0]?.Length ?? 0 : 0;
        return components >= LinearProgramFromComponents && components <= LinearProgramHull.MaxComponents
            ? LinearProgramHull.Build(amounts, energiesEvPerAtom)
            : LowerHull.Build(amounts, energiesEvPerAtom);
    }
}
