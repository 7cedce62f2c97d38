using Hull.Core.Tests.Thermo;
using Hull.Core.Chemistry;
using Hull.Core.Figures;
using Hull.Core.Thermo;

namespace Hull.Core.Tests.Figures;

/// <summary>Generated hulls for the figure tests (seeded random formation energies; no real data).</summary>
internal static class FigureTestData
{
    public static readonly FigureMetadata Metadata = new("figure-test", 7, new string('a', 64));

    /// <summary>
    /// Elements at 0, then random compounds of small integer amounts at random negative formation energies; about
    /// a quarter of them stable.
    /// </summary>
    public static (SystemHull Hull, List<(PhaseEntry Entry, long[] Amounts)> Points) Random(string[] elements, int count, int seed)
    {
        var random = new Random(seed);
        var points = elements.Select(e => (ThermoTestData.Formation($"{e}-ref", e, 0.0), Unit(elements.Length, Array.IndexOf(elements, e)))).ToList();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        int made = 0;
        while (made < count)
        {
            long[] a = elements.Select(_ => (long)random.Next(0, elements.Length == 2 ? 30 : 5)).ToArray();
            if (a.Count(x => x > 0) < 2) continue;
            string formula = string.Concat(elements.Select((e, k) => a[k] == 0 ? string.Empty : $"{e}{a[k]}"));
            if (!seen.Add(formula)) continue;
            points.Add((ThermoTestData.Formation($"c{made:000}", formula, -1.5 * random.NextDouble()), a));
            made++;
        }

        return (SystemHull.OverElements(points.Select(p => p.Item1).ToArray()), points);
    }

    public static long[] Unit(int n, int k) => Enumerable.Range(0, n).Select(j => j == k ? 1L : 0L).ToArray();

    public static FigureResult Draw(SystemHull hull, FigureOptions? options = null) =>
        PhaseDiagram.Draw(FigureInput.FromHull(hull, Metadata), options);

    /// <summary>Atom fractions of integer amounts.</summary>
    public static double[] Fractions(long[] amounts) => amounts.Select(a => a / (double)amounts.Sum()).ToArray();
}
