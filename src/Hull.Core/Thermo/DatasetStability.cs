using System.Runtime.ExceptionServices;

namespace Hull.Core.Thermo;

/// <summary>
/// Stability of every entry of a dataset over many elements. An entry competes only with entries whose elements are
/// a subset of its own, so the dataset is never put into one hull: entries are grouped by chemical system, and a
/// hull is built only for each maximal system (one contained in no other present system) over every entry whose
/// elements it contains. The hull restricted to a face of its simplex is the hull of that face's own entries, so one
/// hull answers for every entry inside it; each entry is reported once, from one hull. Hulls are built in parallel;
/// the results are deterministic and independent of the input order.
/// </summary>
public static class DatasetStability
{
    /// <exception cref="ThermoInputException">Bad rows, repeated ids or missing references.</exception>
    public static DatasetStabilityResult Analyze(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        FormationEnergySet formation = FormationEnergies.Compute(entries, references);
        string[] elements = entries.SelectMany(e => e.Composition.Elements).Distinct().Order(StringComparer.Ordinal).ToArray();
        var bitOf = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int b = 0; b < elements.Length; b++)
        {
            bitOf[elements[b]] = b;
        }

        // Chemical system of each entry as a bit set of elements (at most 118 elements fit in 128 bits).
        var rowsBySystem = new Dictionary<UInt128, List<int>>();
        var systemOfRow = new UInt128[entries.Count];
        for (int row = 0; row < entries.Count; row++)
        {
            UInt128 mask = SystemMask(entries[row], bitOf);
            if (!rowsBySystem.TryGetValue(mask, out List<int>? rows))
            {
                rowsBySystem[mask] = rows = [];
            }

            rows.Add(row);
            systemOfRow[row] = mask;
        }

        // A system is maximal when no larger present system contains it. Entries span few elements, so each
        // system's subsets are enumerated instead of comparing every pair of systems (tens of thousands of each).
        var contained = new HashSet<UInt128>();
        foreach (UInt128 system in rowsBySystem.Keys)
        {
            foreach (UInt128 subset in PresentSubsets(system, rowsBySystem.Keys, rowsBySystem))
            {
                if (subset != system) contained.Add(subset);
            }
        }

        var maximal = new List<(UInt128 Mask, string Name)>();
        foreach (UInt128 system in rowsBySystem.Keys)
        {
            if (!contained.Contains(system)) maximal.Add((system, string.Join("-", ElementsOf(system, elements))));
        }

        // Each system reports from one hull: the smallest maximal system containing it (then by name).
        maximal.Sort((x, y) =>
        {
            int bySize = UInt128.PopCount(x.Mask).CompareTo(UInt128.PopCount(y.Mask));
            return bySize != 0 ? bySize : string.CompareOrdinal(x.Name, y.Name);
        });
        var members = new UInt128[maximal.Count][];
        var reportingHull = new Dictionary<UInt128, int>();
        for (int h = 0; h < maximal.Count; h++)
        {
            members[h] = PresentSubsets(maximal[h].Mask, rowsBySystem.Keys, rowsBySystem).ToArray();
            foreach (UInt128 member in members[h]) reportingHull.TryAdd(member, h);
        }

        // Coordinates, phase and id rank of every entry, worked out once: a binary's entries sit in many hulls.
        var datasetPoints = new DatasetPoints(entries, formation.FormationEnergiesEvPerAtom, rowsBySystem);
        var reportingHullOfRow = new int[entries.Count];
        for (int row = 0; row < entries.Count; row++)
        {
            reportingHullOfRow[row] = reportingHull[systemOfRow[row]];
        }


        // Largest hulls first, so that no big one is left to run alone at the end.
        var work = new (int Hull, int Points)[maximal.Count];
        for (int h = 0; h < maximal.Count; h++)
        {
            int points = 0;
            foreach (UInt128 member in members[h]) points += rowsBySystem[member].Count;
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
                    string[] symbols = ElementsOf(mask, elements);
                    var hullPoints = new HullPoint[item.Points];
                    int count = 0;
                    foreach (UInt128 member in members[item.Hull])
                    {
                        HullPoint[] memberPoints = datasetPoints.Of(member, mask);
                        memberPoints.CopyTo(hullPoints, count);
                        count += memberPoints.Length;
                    }

                    var hull = new SystemHull(new ComponentSpace.OverElements(symbols), hullPoints, formation.References);
                    for (int i = 0; i < hull.PointCount; i++)
                    {
                        int row = hull.RowOfPoint(i);
                        if (row >= 0 && reportingHullOfRow[row] == item.Hull)
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

    /// <summary>The present systems contained in a system (itself included).</summary>
    private static IEnumerable<UInt128> PresentSubsets(
        UInt128 system, IEnumerable<UInt128> present, Dictionary<UInt128, List<int>> rowsBySystem)
    {
        int count = (int)UInt128.PopCount(system);
        if (count > MaxEnumeratedElements)
        {
            foreach (UInt128 candidate in present)
            {
                if ((candidate & system) == candidate) yield return candidate;
            }
            yield break;
        }
        var bits = new UInt128[count];
        int j = 0;
        for (int b = 0; b < 128 && j < count; b++)
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
            if (rowsBySystem.ContainsKey(subset)) yield return subset;
        }
    }

    private static UInt128 SystemMask(PhaseEntry entry, Dictionary<string, int> bitOf)
    {
        UInt128 mask = UInt128.Zero;
        foreach (string element in entry.Composition.Elements)
        {
            mask |= UInt128.One << bitOf[element];
        }

        return mask;
    }

    private static string[] ElementsOf(UInt128 mask, string[] elements)
    {
        var list = new List<string>();
        for (int b = 0; b < elements.Length; b++)
        {
            if ((mask & (UInt128.One << b)) != UInt128.Zero)
            {
                list.Add(elements[b]);
            }
        }

        return list.ToArray();
    }
}
