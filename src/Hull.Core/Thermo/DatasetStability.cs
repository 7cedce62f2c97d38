using System.Runtime.CompilerServices;
using System.Runtime.ExceptionServices;

namespace Hull.Core.Thermo;

/// <summary>
/// Stability of every entry of a dataset over many elements. An entry competes only with entries whose elements are
/// a subset of its own, so the dataset is never put into one hull: entries are grouped by chemical system, and a
/// hull is built only for each maximal system (one contained in no other present system) over every entry whose
/// elements it contains. The hull restricted to a face of its simplex is the hull of that face's own entries, so one
/// hull answers for every entry inside it. Each entry is reported once, from the smallest maximal system that
/// contains it (fewest elements, then by ordinal name): every maximal system containing it gives the same energy
/// above hull, so the rule only fixes which system is named. Hulls are built in parallel; the results are
/// deterministic and independent of the input order.
/// </summary>
/// <remarks>
/// The preparation runs once per call over loops of a hundred thousand rows and tens of thousands of systems, so
/// its methods are compiled fully optimised from the start instead of running first as unoptimised code.
/// </remarks>
public static class DatasetStability
{
    /// <exception cref="ThermoInputException">Bad rows, repeated ids or missing references.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static DatasetStabilityResult Analyze(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        FormationEnergySet formation = FormationEnergies.Compute(entries, references);
        string[] elements = entries.SelectMany(e => e.Composition.Elements).Distinct().Order(StringComparer.Ordinal).ToArray();
        var bitOf = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int b = 0; b < elements.Length; b++)
        {
            bitOf[elements[b]] = b;
        }

        // Chemical system of each entry as a bit set of elements (at most 118 elements fit in 128 bits), numbered in
        // order of first appearance.
        var systemIndex = new Dictionary<UInt128, int>();
        var systems = new List<UInt128>();
        var rowsOfSystem = new List<List<int>>();
        var systemOfRow = new int[entries.Count];
        for (int row = 0; row < entries.Count; row++)
        {
            UInt128 mask = SystemMask(entries[row], bitOf);
            if (!systemIndex.TryGetValue(mask, out int s))
            {
                s = systems.Count;
                systemIndex.Add(mask, s);
                systems.Add(mask);
                rowsOfSystem.Add([]);
            }

            rowsOfSystem[s].Add(row);
            systemOfRow[row] = s;
        }

        // A system is maximal when no larger present system contains it. Entries span few elements, so each
        // system's subsets are enumerated instead of comparing every pair of systems (tens of thousands of each).
        var contained = new bool[systems.Count];
        var subsets = new List<int>();
        for (int s = 0; s < systems.Count; s++)
        {
            PresentSubsets(systems[s], systems, systemIndex, subsets);
            foreach (int subset in subsets)
            {
                if (subset != s) contained[subset] = true;
            }
        }

        var maximal = new List<(UInt128 Mask, string Name)>();
        for (int s = 0; s < systems.Count; s++)
        {
            if (!contained[s]) maximal.Add((systems[s], string.Join("-", ElementsOf(systems[s], elements))));
        }

        // Each system reports from one hull: the smallest maximal system containing it (then by name).
        maximal.Sort((x, y) =>
        {
            int bySize = UInt128.PopCount(x.Mask).CompareTo(UInt128.PopCount(y.Mask));
            return bySize != 0 ? bySize : string.CompareOrdinal(x.Name, y.Name);
        });
        var members = new int[maximal.Count][];
        var reportingHull = new int[systems.Count];
        var hullsOfSystem = new int[systems.Count];
        Array.Fill(reportingHull, -1);
        for (int h = 0; h < maximal.Count; h++)
        {
            PresentSubsets(maximal[h].Mask, systems, systemIndex, subsets);
            members[h] = subsets.ToArray();
            foreach (int member in members[h])
            {
                if (reportingHull[member] < 0) reportingHull[member] = h;
                hullsOfSystem[member]++;
            }
        }

        // Coordinates, phase and id rank of every entry, worked out once: a binary's entries sit in many hulls.
        var datasetPoints = new DatasetPoints(entries, formation.FormationEnergiesEvPerAtom, systems, rowsOfSystem, hullsOfSystem);

        // Largest hulls first, so that no big one is left to run alone at the end.
        var work = new (int Hull, int Points)[maximal.Count];
        for (int h = 0; h < maximal.Count; h++)
        {
            int points = 0;
            foreach (int member in members[h]) points += rowsOfSystem[member].Count;
            work[h] = (h, points);
        }

        Array.Sort(work, (x, y) => x.Points != y.Points ? y.Points.CompareTo(x.Points) : x.Hull.CompareTo(y.Hull));
        var results = new EntryStability[entries.Count];
        var failures = new System.Collections.Concurrent.ConcurrentBag<Exception>();
        Parallel.ForEach(
            work,
            new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount },
            item =>
            {
                try
                {
                    UInt128 mask = maximal[item.Hull].Mask;
                    var hullPoints = new HullPoint[item.Points];
                    int count = 0;
                    foreach (int member in members[item.Hull])
                    {
                        HullPoint[] memberPoints = datasetPoints.Of(member, mask);
                        memberPoints.CopyTo(hullPoints, count);
                        count += memberPoints.Length;
                    }

                    var space = new ComponentSpace.OverElements(ElementsOf(mask, elements));
                    var hull = new SystemHull(space, hullPoints, formation.References, onDemand: true);
                    for (int i = 0; i < hull.PointCount; i++)
                    {
                        int row = hull.RowOfPoint(i);
                        if (row >= 0 && reportingHull[systemOfRow[row]] == item.Hull)
                        {
                            results[row] = hull.ComputeEntry(i);
                        }
                    }
                }
                catch (Exception e)
                {
                    failures.Add(e);
                }
            });

        if (!failures.IsEmpty)
        {
            // Report the failure of the earliest row so the answer does not depend on thread timing.
            Exception first = failures
                .OrderBy(e => e is ThermoInputException { RowIndex: int r } ? r : int.MaxValue)
                .ThenBy(e => e.Message, StringComparer.Ordinal)
                .First();
            ExceptionDispatchInfo.Capture(first).Throw();
        }

        string[] hullSystems = maximal.Select(m => m.Name).ToArray();
        Array.Sort(hullSystems, StringComparer.Ordinal);
        return new DatasetStabilityResult(results, hullSystems, formation.References);
    }

    /// <summary>Widest system whose subsets are enumerated; a wider one is compared with every present system.</summary>
    private const int MaxEnumeratedElements = 16;

    /// <summary>Fills <paramref name="found"/> with the present systems contained in a system (itself included).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void PresentSubsets(
        UInt128 system, List<UInt128> present, Dictionary<UInt128, int> indexOf, List<int> found)
    {
        found.Clear();
        int count = (int)UInt128.PopCount(system);
        if (count > MaxEnumeratedElements)
        {
            for (int s = 0; s < present.Count; s++)
            {
                if ((present[s] & system) == present[s]) found.Add(s);
            }

            return;
        }

        Span<UInt128> bits = stackalloc UInt128[count];
        int j = 0;
        for (int b = 0; j < count; b++)
        {
            UInt128 bit = UInt128.One << b;
            if ((system & bit) != UInt128.Zero) bits[j++] = bit;
        }

        for (int pick = 1; pick < 1 << count; pick++)
        {
            UInt128 subset = UInt128.Zero;
            for (int i = 0; i < count; i++)
            {
                if ((pick & (1 << i)) != 0) subset |= bits[i];
            }

            if (indexOf.TryGetValue(subset, out int s)) found.Add(s);
        }
    }

    private static UInt128 SystemMask(PhaseEntry entry, Dictionary<string, int> bitOf)
    {
        UInt128 mask = UInt128.Zero;
        IReadOnlyList<string> symbols = entry.Composition.Elements;
        for (int e = 0; e < symbols.Count; e++)
        {
            mask |= UInt128.One << bitOf[symbols[e]];
        }

        return mask;
    }

    private static string[] ElementsOf(UInt128 mask, string[] elements)
    {
        var symbols = new string[(int)UInt128.PopCount(mask)];
        for (int b = 0, next = 0; next < symbols.Length; b++)
        {
            if ((mask & (UInt128.One << b)) != UInt128.Zero)
            {
                symbols[next++] = elements[b];
            }
        }

        return symbols;
    }
}
