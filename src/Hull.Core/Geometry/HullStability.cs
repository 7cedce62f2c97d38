namespace Hull.Core.Geometry;

/// <summary>Chooses the hull engine for a point set by its number of components and compositions.</summary>
public static class HullStability
{
    /// <summary>
    /// From this many components on, stability is computed by <see cref="LinearProgramHull"/>. The number of lower
    /// facets grows roughly as the point count to the power (components − 1) / 2, so in six components and more
    /// a few thousand points already give 1e5–1e6 facets, while one small program per composition stays
    /// proportional to the points (measured: bench/README.md).
    /// </summary>
    public const int LinearProgramFromComponents = 6;

    /// <summary>
    /// Up to this many distinct compositions, <see cref="LinearProgramHull"/> is used in any number of components:
    /// each program prices at most this many columns, so all of them together cost less than building and walking
    /// facets. With many more compositions in two to five components the facets are few compared with the
    /// programs' quadratic cost, and <see cref="LowerHull"/> is faster (e.g. 51,000 compositions in four
    /// components: 1.5 s against 30 s).
    /// </summary>
    public const int LinearProgramUpToCompositions = 4096;

    /// <summary>
    /// Builds the engine that suits the data. Same input, checks and tie rules as <see cref="LowerHull.Build(IReadOnlyList{long[]}, IReadOnlyList{double})"/>.
    /// </summary>
    public static IHullStability Build(IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom) =>
        Build(HullInput.Check(amounts, energiesEvPerAtom), onDemand: false);

    /// <summary>
    /// As <see cref="Build(IReadOnlyList{long[]}, IReadOnlyList{double})"/> with the amounts stored row after row in
    /// one array, <paramref name="componentCount"/> per point (a large input then needs no array per point).
    /// </summary>
    public static IHullStability Build(long[] amountsRowMajor, int componentCount, IReadOnlyList<double> energiesEvPerAtom) =>
        Build(HullInput.Check(amountsRowMajor, componentCount, energiesEvPerAtom), onDemand: false);

    /// <summary>As the public overload; on demand, the program engine solves compositions when asked (one thread only).</summary>
    internal static IHullStability Build(HullInput input, bool onDemand)
    {
        bool programs = input.ComponentCount <= LinearProgramHull.MaxComponents
            && (input.ComponentCount >= LinearProgramFromComponents || input.CompositionCount <= LinearProgramUpToCompositions);
        return programs ? LinearProgramHull.Prepare(input, onDemand) : LowerHull.Build(input);
    }
}
