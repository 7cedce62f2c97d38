using System.Runtime.CompilerServices;
using System.Runtime.ExceptionServices;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// Stability of every entry of a dataset over many elements. An entry competes only with entries whose elements are
/// a subset of its own, so the dataset is never put into one hull: entries are grouped by chemical system
/// (<see cref="ChemicalSystemGrouping"/>), and a hull is built only for each maximal system (one contained in no other
/// present system) over every entry whose elements it contains. The hull restricted to a face of its simplex is the
/// hull of that face's own entries, so one hull answers for every entry inside it. Each entry is reported once, from
/// the smallest maximal system that contains it (fewest elements, then by ordinal name): every maximal system
/// containing it gives the same energy above hull, so the rule only fixes which system is named. Hulls are built in
/// parallel; the results are deterministic and independent of the input order.
/// </summary>
/// <remarks>
/// The preparation runs once per call over loops of a hundred thousand rows and tens of thousands of systems, so
/// its methods are compiled fully optimised from the start instead of running first as unoptimised code.
/// </remarks>
public static class DatasetStability
{
    /// <summary>
    /// The analysis. An entry without a usable formation energy (a total energy with no elemental reference, or a
    /// formation energy out of range) does not fail the call: its chemical system is reported in
    /// <see cref="DatasetStabilityResult.Problems"/>, every entry of that system or of a system containing it is left
    /// unanswered (its hull would need the unusable entry), and every other entry is answered.
    /// </summary>
    /// <exception cref="ThermoInputException">Null rows, repeated ids, or amounts beyond 64 bits.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static DatasetStabilityResult Analyze(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        FormationEnergySet formation = FormationEnergies.Evaluate(entries, references);
        var unusable = new bool[entries.Count];
        foreach (EntryEnergyProblem problem in formation.Problems) unusable[problem.RowIndex] = true;
        var compositions = new Composition[entries.Count];
        for (int row = 0; row < compositions.Length; row++)
        {
            compositions[row] = entries[row].Composition;
        }

        // Entries whose energy cannot be used are in no hull; the systems that would need them are reported below.
        var grouping = new ChemicalSystemGrouping(compositions, unusable);

        // Coordinates, phase and id rank of every entry, worked out once: a binary's entries sit in many hulls.
        var datasetPoints = new DatasetPoints(
            entries, formation.FormationEnergiesEvPerAtom, grouping.SystemMasks, grouping.RowsOfSystems, grouping.HullCounts);

        // Largest hulls first, so that no big one is left to run alone at the end.
        var work = new (int Hull, int Points)[grouping.MaximalCount];
        for (int h = 0; h < work.Length; h++)
        {
            int points = 0;
            foreach (int member in grouping.MembersOf(h)) points += datasetPoints.CountOf(member, grouping.ReportingHullOf(member) == h);
            work[h] = (h, points);
        }

        Array.Sort(work, (x, y) => x.Points != y.Points ? y.Points.CompareTo(x.Points) : x.Hull.CompareTo(y.Hull));
        var results = new EntryStability?[entries.Count];
        var coverage = new SystemCoverage[grouping.MaximalCount];
        var failures = new System.Collections.Concurrent.ConcurrentBag<Exception>();
        Parallel.ForEach(
            work,
            new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount },
            item =>
            {
                try
                {
                    UInt128 mask = grouping.MaximalMask(item.Hull);
                    var hullPoints = new HullPoint[item.Points];
                    int count = 0;
                    int entryCount = 0;
                    var pureEntries = new int[(int)UInt128.PopCount(mask)];
                    foreach (int member in grouping.MembersOf(item.Hull))
                    {
                        HullPoint[] memberPoints = datasetPoints.Of(member, mask, grouping.ReportingHullOf(member) == item.Hull);
                        memberPoints.CopyTo(hullPoints, count);
                        count += memberPoints.Length;
                        int rows = grouping.RowsOf(member).Count;
                        entryCount += rows;
                        if (UInt128.PopCount(grouping.MaskOfSystem(member)) == 1)
                        {
                            pureEntries[ColumnOf(grouping.MaskOfSystem(member), mask)] += rows;
                        }
                    }

                    var space = new ComponentSpace.OverElements(grouping.SymbolsOf(mask));
                    var hull = new SystemHull(HullAxis.FormationEnergy, space, hullPoints, formation.References, onDemand: true);
                    // Counted over every entry of the hull's system, including those its points leave out.
                    coverage[item.Hull] = hull.CoverageOf(pureEntries, entryCount);
                    for (int i = 0; i < hull.PointCount; i++)
                    {
                        int row = hull.RowOfPoint(i);
                        if (row >= 0 && grouping.ReportingHullOf(grouping.SystemOfRow(row)) == item.Hull)
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

        IReadOnlyList<SystemProblem> problems = ReportProblems(entries, formation.Problems, grouping, results);
        string[] hullSystems = Enumerable.Range(0, grouping.MaximalCount).Select(grouping.MaximalName).ToArray();
        Array.Sort(hullSystems, StringComparer.Ordinal);
        SystemCoverage[] coverageByName = coverage.OrderBy(c => c.HullSystem, StringComparer.Ordinal).ToArray();
        EntryStability[] answered = results.OfType<EntryStability>().ToArray();
        return new DatasetStabilityResult(answered, hullSystems, formation.References, coverageByName, problems);
    }

    /// <summary>The column of a one-element system's element among the elements of a system containing it.</summary>
    private static int ColumnOf(UInt128 element, UInt128 system) => (int)UInt128.PopCount(system & (element - UInt128.One));

    /// <summary>
    /// Groups the unusable entries by chemical system and clears the answer of every entry whose system contains one
    /// of those systems; each such entry is listed under the smallest of them (then by name).
    /// </summary>
    private static IReadOnlyList<SystemProblem> ReportProblems(
        IReadOnlyList<PhaseEntry> entries, IReadOnlyList<EntryEnergyProblem> causes, ChemicalSystemGrouping grouping,
        EntryStability?[] results)
    {
        if (causes.Count == 0) return [];
        var maskOfRow = new UInt128[entries.Count];
        for (int row = 0; row < maskOfRow.Length; row++)
        {
            maskOfRow[row] = grouping.MaskOf(entries[row].Composition);
        }

        var bySystem = causes
            .GroupBy(c => maskOfRow[c.RowIndex])
            .Select(g => (Mask: g.Key, Name: string.Join("-", grouping.SymbolsOf(g.Key))))
            .OrderBy(g => UInt128.PopCount(g.Mask))
            .ThenBy(g => g.Name, StringComparer.Ordinal)
            .ToArray();
        // A cause inside a larger system that already contains a smaller problem system is reported with that one
        // (its entries are unanswered because of it anyway), so each entry appears under one problem only.
        var groups = bySystem
            .Where((g, k) => !bySystem.Take(k).Any(smaller => (smaller.Mask & g.Mask) == smaller.Mask))
            .Select(g => (g.Mask, g.Name, Causes: new List<EntryEnergyProblem>()))
            .ToArray();
        foreach (EntryEnergyProblem cause in causes)
        {
            groups.First(g => (g.Mask & maskOfRow[cause.RowIndex]) == g.Mask).Causes.Add(cause);
        }

        var unanswered = groups.Select(_ => new List<string>()).ToArray();
        for (int row = 0; row < entries.Count; row++)
        {
            for (int g = 0; g < groups.Length; g++)
            {
                if ((groups[g].Mask & maskOfRow[row]) == groups[g].Mask)
                {
                    results[row] = null;
                    unanswered[g].Add(entries[row].Id);
                    break;
                }
            }
        }

        return groups
            .Select((g, k) => new SystemProblem(g.Name, g.Causes, unanswered[k]))
            .OrderBy(p => p.ChemicalSystem, StringComparer.Ordinal)
            .ToArray();
    }
}
