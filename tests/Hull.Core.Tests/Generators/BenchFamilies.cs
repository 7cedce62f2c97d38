using Hull.Bench.Data;

namespace Hull.Core.Tests.Generators;

/// <summary>The benchmark's point families (bench/Hull.Bench/Data, compiled into this project) as test point sets.</summary>
public static class BenchFamilies
{
    public static PointSet Generate(string family, int components, int count, int seed)
    {
        var f = Enum.Parse<PointFamily>(family, ignoreCase: true);
        var set = PointFamilies.Generate(f, components, count, seed);
        var kinds = set.Amounts.Select(a => a.Count(v => v != 0) == 1 ? "pure" : family).ToList();
        return new PointSet(components, set.Amounts, set.EnergiesEvPerAtom, kinds);
    }
}
