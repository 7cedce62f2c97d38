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
    /// <exception cref="ThermoInputException">Bad rows, repeated ids or missing references.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static DatasetStabilityResult Analyze(IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null)
    {
        FormationEnergySet formation = FormationEnergies.Compute(entries, references);
        var compositions = new Composition[entries.Count];
        for (int row = 0; row < compositions.Length; row++)
        {
            compositions[row] = entries[row].Composition;
        }

        var grouping = new ChemicalSystemGrouping(compositions);

        // Coordinates, phase and id rank of every entry, worked out once: a binary's entries sit in many hulls.
        var datasetPoints = new DatasetPoints(
            entries, formation.FormationEnergiesEvPerAtom, grouping.SystemMasks, grouping.RowsOfSystems, grouping.HullCounts);

        // Largest hulls first, so that no big one is left to run alone at the end.
        var work = new (int Hull, int Points)[grouping.MaximalCount];
        for (int h = 0; h < work.Length; h++)
        {
            int points = 0;
            foreach (int member in grouping.MembersOf(h)) points += grouping.RowsOf(member).Count;
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
                    UInt128 mask = grouping.MaximalMask(item.Hull);
                    var hullPoints = new HullPoint[item.Points];
                    int count = 0;
                    foreach (int member in grouping.MembersOf(item.Hull))
                    {
                        HullPoint[] memberPoints = datasetPoints.Of(member, mask);
                        memberPoints.CopyTo(hullPoints, count);
                        count += memberPoints.Length;
                    }

                    var space = new ComponentSpace.OverElements(grouping.SymbolsOf(mask));
                    var hull = new SystemHull(HullAxis.FormationEnergy, space, hullPoints, formation.References, onDemand: true);
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

        string[] hullSystems = Enumerable.Range(0, grouping.MaximalCount).Select(grouping.MaximalName).ToArray();
        Array.Sort(hullSystems, StringComparer.Ordinal);
        return new DatasetStabilityResult(results, hullSystems, formation.References);
    }
}
