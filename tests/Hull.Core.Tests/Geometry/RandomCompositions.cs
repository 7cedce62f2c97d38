namespace Hull.Core.Tests.Geometry;

/// <summary>Hypothetical compositions for Locate: random points of the simplex, a third of them on a face.</summary>
internal static class RandomCompositions
{
    public static List<double[]> Generate(int components, int count, int seed)
    {
        var rng = new Random(seed);
        var result = new List<double[]>(count);
        for (int i = 0; i < count; i++)
        {
            // Exponential draws normalised are uniform on the simplex.
            var x = Enumerable.Range(0, components).Select(_ => -Math.Log(1.0 - rng.NextDouble())).ToArray();
            if (rng.Next(3) == 0)
            {
                int zeros = 1 + rng.Next(components - 1);
                for (int z = 0; z < zeros; z++) x[rng.Next(components)] = 0;
                if (x.All(v => v == 0)) x[rng.Next(components)] = 1;
            }
            double total = x.Sum();
            result.Add(x.Select(v => v / total).ToArray());
        }
        return result;
    }
}
