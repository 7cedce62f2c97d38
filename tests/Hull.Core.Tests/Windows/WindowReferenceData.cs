using Hull.Core.Thermo;
using Hull.Core.Windows;

namespace Hull.Core.Tests.Windows;

/// <summary>Shared pieces of the window reference checks: the window problem written out independently of the module.</summary>
internal static class WindowReferenceData
{
    /// <summary>Entries whose elements all lie in <paramref name="elements"/>.</summary>
    public static PhaseEntry[] Within(IEnumerable<PhaseEntry> entries, IReadOnlyList<string> elements) =>
        entries.Where(e => e.Composition.Elements.All(elements.Contains)).ToArray();

    public static double[] Fractions(PhaseEntry e, IReadOnlyList<string> elements) =>
        elements.Select(e.Composition.AtomicFraction).ToArray();

    /// <summary>
    /// Every other entry's limit a·μ ≤ E (all entries, not only stable ones: the reference does not rely on the
    /// module's claim that the others are implied) and Δμ_i ≤ 0; entries of the compound's own composition are left
    /// out (their limit is the equality itself or weaker).
    /// </summary>
    public static List<(double[] A, double B)> Limits(IReadOnlyList<PhaseEntry> entries, PhaseEntry compound, IReadOnlyList<string> elements)
    {
        var limits = new List<(double[], double)>();
        foreach (PhaseEntry e in entries)
        {
            if (e.Composition.HasSameProportions(compound.Composition)) continue;
            limits.Add((Fractions(e, elements), e.EnergyEvPerAtom));
        }

        for (int i = 0; i < elements.Count; i++)
        {
            var a = new double[elements.Count];
            a[i] = 1;
            limits.Add((a, 0.0));
        }

        return limits;
    }

    /// <summary>True when every point of <paramref name="a"/> is within <paramref name="tolerance"/> (max norm) of one of <paramref name="b"/>.</summary>
    public static bool Covers(IEnumerable<IReadOnlyList<double>> a, IReadOnlyList<IReadOnlyList<double>> b, double tolerance) =>
        a.All(p => b.Any(q => p.Zip(q).All(t => Math.Abs(t.First - t.Second) <= tolerance)));

    public static string Show(IEnumerable<IReadOnlyList<double>> points) =>
        string.Join("\n", points.Select(p => string.Join(' ', p.Select(v => v.ToString("R", System.Globalization.CultureInfo.InvariantCulture)))));

    public static IEnumerable<(SystemHull Hull, EntryStability Compound)> Compounds(string[] elements, PhaseEntry[] entries)
    {
        SystemHull hull = SystemHull.OverElements(Within(entries, elements), elements: elements);
        foreach (EntryStability e in hull.Entries)
        {
            if (e.Composition.Elements.Count == elements.Length) yield return (hull, e);
        }
    }

    public static int IndexOf(IReadOnlyList<string> elements, string element) => elements.ToList().IndexOf(element);

    public static string Omitted(StabilityWindow window) => window.Elements.Except(window.Size!.ProjectionElements).Single();
}
