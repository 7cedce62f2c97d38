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
        for (int row = 0; row < entries.Count; row++)
        {
            UInt128 mask = SystemMask(entries[row], bitOf);
            if (!rowsBySystem.TryGetValue(mask, out List<int>? rows))
            {
                rowsBySystem[mask] = rows = [];
            }

            rows.Add(row);
        }

        string NameOf(UInt128 mask) => string.Join("-", ElementsOf(mask, elements));

        // A system is maximal when no larger present system contains it; containment is transitive, so checking
        // against the maximal systems found so far (largest first) suffices.
        UInt128[] systems = rowsBySystem.Keys
            .OrderByDescending(m => UInt128.PopCount(m))
            .ThenBy(NameOf, StringComparer.Ordinal)
            .ToArray();
        var maximal = new List<UInt128>();
        foreach (UInt128 system in systems)
        {
            if (!maximal.Any(m => (system & m) == system))
            {
                maximal.Add(system);
            }
        }

        // Each system reports from one hull: the smallest maximal system containing it (then by name).
        UInt128[] owners = maximal.OrderBy(m => UInt128.PopCount(m)).ThenBy(NameOf, StringComparer.Ordinal).ToArray();
        var ownerOf = new Dictionary<UInt128, UInt128>();
        foreach (UInt128 system in systems)
        {
            ownerOf[system] = owners.First(m => (system & m) == system);
        }

        var results = new EntryStability[entries.Count];
        var failures = new System.Collections.Concurrent.ConcurrentBag<Exception>();
        var work = owners
            .Select(m => (Mask: m, Members: systems.Where(s => (s & m) == s).ToArray()))
            .OrderByDescending(w => w.Members.Sum(s => rowsBySystem[s].Count))
            .ToArray();
        Parallel.ForEach(
            work,
            new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount },
            item =>
            {
                try
                {
                    var inputs = item.Members
                        .SelectMany(s => rowsBySystem[s])
                        .Select(row => (entries[row], row, formation.FormationEnergiesEvPerAtom[row]))
                        .ToArray();
                    var hull = new SystemHull(
                        new ComponentSpace.OverElements(ElementsOf(item.Mask, elements)), inputs, formation.References);
                    foreach ((int point, int row) in hull.EntryPoints())
                    {
                        if (ownerOf[SystemMask(entries[row], bitOf)] == item.Mask)
                        {
                            results[row] = hull.ComputeEntry(point);
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

        return new DatasetStabilityResult(
            results, maximal.Select(NameOf).Order(StringComparer.Ordinal).ToArray(), formation.References);
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
