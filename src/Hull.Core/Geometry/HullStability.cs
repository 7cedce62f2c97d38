namespace Hull.Core.Geometry;

/// <summary>
/// Chooses the hull engine for a point set from how its facets grow: the incremental hull is tried first and
/// watched, and when its facets explode the point set goes to the program engine instead.
/// </summary>
/// <remarks>
/// The incremental hull's cost is the facets it makes (each added point builds its whole star), the program
/// engine's the columns it prices, which the engine keeps to the ones that can matter. Both depend on the data,
/// not on the number of components alone: facets per added point grow with the dimension and with how many
/// compositions are stable (about 5 in three components, 15–20 in four, 50–85 in five, hundreds from six on), and
/// few stable compositions among many keep the facets per composition low in any dimension. The two limits are
/// where the engines' measured costs cross on the bench families (bench/README.md, suite engine-choice):
/// <see cref="HullUpToFacetsPerPointAdded"/> stops an explosion after a few thousand facets (the rate counts at
/// least <see cref="LowerHullBuilder.JudgeRateFromPoints"/> points), <see cref="HullUpToFacetsPerComposition"/>
/// bounds what a hull that grows steadily but too much may cost before it is given up.
/// </remarks>
public static class HullStability
{
    /// <summary>
    /// The incremental hull is kept while it makes at most this many facets per point it adds. Measured: 50–60 on
    /// the pair family in five components, where the incremental hull is 1.5–4× faster; 77–83 on the dense family
    /// in five components and 280 and more from six on, where the program engine is 2–20× faster.
    /// </summary>
    public const double HullUpToFacetsPerPointAdded = 70;

    /// <summary>
    /// The incremental hull is given up once it has made this many facets per distinct composition. Measured: up to
    /// 19 where it is the faster engine (three and four components, and five on the pair family), 31 and more where
    /// the program engine is (sparse and dense families in five components).
    /// </summary>
    public const double HullUpToFacetsPerComposition = 25;

    /// <summary>
    /// For a dataset's small hulls (solved on demand, only the compositions each reports): up to this many
    /// distinct compositions, and from <see cref="OnDemandProgramsFromComponents"/> components on, the program
    /// engine answers them without building the rest.
    /// </summary>
    public const int OnDemandProgramsUpToCompositions = 4096;

    /// <summary>See <see cref="OnDemandProgramsUpToCompositions"/>.</summary>
    public const int OnDemandProgramsFromComponents = 6;

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

    /// <summary>
    /// As <see cref="Build(HullInput, bool)"/> (not on demand) for a point set like the one <paramref name="like"/>
    /// was built from (the same compositions at other energies, such as one sample of uncertain energies): where
    /// that one's facets exploded, straight to the program engine, without trying the incremental hull again.
    /// </summary>
    internal static IHullStability BuildLike(HullInput input, IHullStability like) =>
        like is LinearProgramHull && input.ComponentCount <= LinearProgramHull.MaxComponents
            ? LinearProgramHull.Prepare(input, onDemand: false)
            : Build(input, onDemand: false);

    /// <summary>As the public overload; on demand, the program engine solves compositions when asked (one thread only).</summary>
    internal static IHullStability Build(HullInput input, bool onDemand)
    {
        if (input.ComponentCount > LinearProgramHull.MaxComponents) return LowerHull.Build(input);
        if (onDemand)
        {
            bool programs = input.ComponentCount >= OnDemandProgramsFromComponents || input.CompositionCount <= OnDemandProgramsUpToCompositions;
            return programs ? LinearProgramHull.Prepare(input, onDemand: true) : LowerHull.Build(input);
        }
        try
        {
            return LowerHull.Build(input, new FacetLimits(HullUpToFacetsPerPointAdded, HullUpToFacetsPerComposition * input.CompositionCount));
        }
        catch (FacetBudgetExceededException)
        {
            return LinearProgramHull.Prepare(input, onDemand: false);
        }
    }
}
