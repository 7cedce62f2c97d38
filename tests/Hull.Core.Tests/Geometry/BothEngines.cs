using System.Diagnostics;
using Hull.Core.Geometry;
using Hull.Core.Tests.Generators;

namespace Hull.Core.Tests.Geometry;

/// <summary>Both hull engines built on the same point set, with their build times, so checks can run on each.</summary>
internal sealed record BothEngines(LowerHull Facets, LinearProgramHull Programs, TimeSpan FacetsBuildTime, TimeSpan ProgramsBuildTime)
{
    public static BothEngines Build(PointSet set)
    {
        var clock = Stopwatch.StartNew();
        var facets = LowerHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        var facetsTime = clock.Elapsed;
        clock.Restart();
        var programs = LinearProgramHull.Build(set.Amounts, set.EnergiesEvPerAtom);
        return new BothEngines(facets, programs, facetsTime, clock.Elapsed);
    }

    /// <summary>The engines by name, for messages that say which one disagreed.</summary>
    public IReadOnlyList<(string Name, IHullStability Hull)> All => [(nameof(LowerHull), Facets), (nameof(LinearProgramHull), Programs)];

    public string Timings =>
        $"build {nameof(LowerHull)} {FacetsBuildTime.TotalMilliseconds:F0} ms, {nameof(LinearProgramHull)} {ProgramsBuildTime.TotalMilliseconds:F0} ms";
}

/// <summary>Builds one engine by name, for theories that run the same worked example through each.</summary>
internal static class HullEngine
{
    public const string Facets = nameof(LowerHull);
    public const string Programs = nameof(LinearProgramHull);

    public static IHullStability Build(string engine, IReadOnlyList<long[]> amounts, IReadOnlyList<double> energiesEvPerAtom) => engine switch
    {
        Facets => LowerHull.Build(amounts, energiesEvPerAtom),
        Programs => LinearProgramHull.Build(amounts, energiesEvPerAtom),
        _ => throw new ArgumentOutOfRangeException(nameof(engine), engine, "no such hull engine"),
    };
}
