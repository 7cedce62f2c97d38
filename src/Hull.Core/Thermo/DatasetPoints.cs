using System.Collections.Concurrent;
using System.Runtime.InteropServices;

namespace Hull.Core.Thermo;

/// <summary>
/// The hull points of a dataset's chemical systems, made once per layout. A subsystem's points are the same in
/// every hull that places its elements in the same columns (a binary sits in a hundred quaternary hulls but in only
/// a few layouts), so they are shared between those hulls instead of being rebuilt for each. Safe for parallel use.
/// </summary>
/// <remarks>
/// A hull that does not report a subsystem needs only one of its entries per composition: the representative
/// (lowest energy, then lowest id), which is all the engine hulls. The other entries of that composition change no
/// answer of that hull, so they are left out of it (a binary's hundreds of entries then weigh a few dozen points in
/// each of its hundred hulls); the hull numbers its compositions by the dataset's first entry of each, as a hull of
/// every entry would (<see cref="HullPoint.CompositionFirstRank"/>); where a hull has a synthetic corner, placed by
/// the points it holds, the first entry of each composition is kept too. The composition grouping behind this is done
/// here once per dataset. It is skipped when some entry would fail the engine's input checks, so that such a fault
/// is reported exactly as by a hull holding every entry.
/// </remarks>
internal sealed class DatasetPoints
{
    private readonly IReadOnlyList<PhaseEntry> _entries;
    private readonly PreparedCoordinates[] _prepared;
    private readonly HullPhase[] _phases;
    private readonly int[] _sortRank;
    private readonly IReadOnlyList<UInt128> _systems;
    private readonly IReadOnlyList<List<int>> _rowsOfSystem;
    private readonly IReadOnlyList<int> _hullsOfSystem;
    private readonly int[][]? _keptRowsOfSystem;
    private readonly int[]? _compositionKey;
    // Per row: the id rank of the first entry of its composition.
    private readonly int[]? _compositionFirstRank;
    private readonly ConcurrentDictionary<(int System, UInt128 Columns, int Width), HullPoint[]> _byLayout = new();

    /// <param name="entries">The dataset.</param>
    /// <param name="formationEvPerAtom">Formation energy of each row.</param>
    /// <param name="systems">The present chemical systems (bit sets over the dataset's elements).</param>
    /// <param name="rowsOfSystem">Rows of each system.</param>
    /// <param name="hullsOfSystem">Number of hulls that contain each system.</param>
    /// <exception cref="ThermoInputException">When an entry's integer amounts do not fit in 64 bits (the earliest such row).</exception>
    public DatasetPoints(
        IReadOnlyList<PhaseEntry> entries,
        IReadOnlyList<double> formationEvPerAtom,
        IReadOnlyList<UInt128> systems,
        IReadOnlyList<List<int>> rowsOfSystem,
        IReadOnlyList<int> hullsOfSystem)
    {
        _hullsOfSystem = hullsOfSystem;
        _entries = entries;
        _systems = systems;
        _rowsOfSystem = rowsOfSystem;
        _prepared = new PreparedCoordinates[entries.Count];
        _phases = new HullPhase[entries.Count];
        var failures = new ThermoInputException?[entries.Count];
        bool failed = false;

        // Exact arithmetic per entry, independent between entries.
        Parallel.For(
            0,
            entries.Count,
            new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount },
            row =>
            {
                PhaseEntry entry = entries[row];
                try
                {
                    _prepared[row] = PreparedCoordinates.Of(entry, row);
                }
                catch (ThermoInputException e)
                {
                    failures[row] = e;
                    failed = true;
                }

                _phases[row] = new HullPhase(entry.Id, isSynthetic: false, entry.Composition, formationEvPerAtom[row], formationEvPerAtom[row]);
            });

        if (failed)
        {
            throw failures.First(e => e is not null)!;
        }

        _sortRank = OrdinalIdRanks(entries);
        if (PassesHullChecks(rowsOfSystem, formationEvPerAtom))
        {
            _compositionKey = new int[entries.Count];
            _compositionFirstRank = new int[entries.Count];
            _keptRowsOfSystem = KeptRows(rowsOfSystem, formationEvPerAtom, EveryElementHasPureEntry(systems));
        }
    }

    /// <summary>
    /// Number of points <see cref="Of"/> gives for a subsystem: every entry in the hull that reports it, the kept ones
    /// elsewhere.
    /// </summary>
    public int CountOf(int subsystem, bool reported) =>
        reported || _keptRowsOfSystem is null ? _rowsOfSystem[subsystem].Count : _keptRowsOfSystem[subsystem].Length;

    /// <summary>
    /// The points of a present subsystem's entries in the columns of a system that contains it: all of them when
    /// that system's hull reports the subsystem, otherwise those its answers depend on (see the remarks).
    /// </summary>
    public HullPoint[] Of(int subsystem, UInt128 system, bool reported)
    {
        if (reported || _keptRowsOfSystem is null)
        {
            return AllOf(subsystem, system);
        }

        int width = (int)UInt128.PopCount(system);
        int[] columns = ColumnsOf(_systems[subsystem], system);
        int[] rows = _keptRowsOfSystem[subsystem];
        if (_hullsOfSystem[subsystem] < 3)
        {
            // In two hulls at most: it is reported by one, kept in the other; nothing to share.
            return Make(rows, columns, width);
        }

        var key = (subsystem, ColumnSet(columns), width);
        if (!_byLayout.TryGetValue(key, out HullPoint[]? points))
        {
            points = _byLayout.GetOrAdd(key, Make(rows, columns, width));
        }

        return points;
    }

    /// <summary>
    /// True when every entry passes the engine's per-point input checks (amounts adding up within 64 bits, energy
    /// finite and in range), which then hold in every hull.
    /// </summary>
    private bool PassesHullChecks(IReadOnlyList<List<int>> rowsOfSystem, IReadOnlyList<double> formationEvPerAtom)
    {
        foreach (List<int> rows in rowsOfSystem)
        {
            foreach (int row in rows)
            {
                double energy = formationEvPerAtom[row];
                if (!double.IsFinite(energy) || Math.Abs(energy) > Geometry.HullTolerances.MaxEnergyMagnitudeEvPerAtom)
                {
                    return false;
                }

                long total = 0;
                foreach (long amount in _prepared[row].Amounts)
                {
                    if (amount < 0 || amount > long.MaxValue - total)
                    {
                        return false;
                    }

                    total += amount;
                }
            }
        }

        return true;
    }

    /// <summary>True when every element of the systems has a system of its own (so no hull needs a synthetic corner).</summary>
    private static bool EveryElementHasPureEntry(IReadOnlyList<UInt128> systems)
    {
        UInt128 all = UInt128.Zero, pure = UInt128.Zero;
        foreach (UInt128 system in systems)
        {
            all |= system;
            if (UInt128.PopCount(system) == 1)
            {
                pure |= system;
            }
        }

        return all == pure;
    }

    /// <summary>
    /// Per system, the rows a hull that does not report it needs: per composition (equal coprime amounts; rows of
    /// one system share their elements) the one of lowest energy, the first by id among exact ties (the engine's
    /// representative), and, when <paramref name="representativesOnly"/> is false, the first by id. Also numbers the
    /// dataset's compositions (system by system) and notes the id rank of each one's first entry, which orders the
    /// compositions of a hull as a hull of all entries would.
    /// </summary>
    /// <remarks>
    /// The first entry of each composition is left out only where no hull has a synthetic corner: a hull places a
    /// corner by its position among the points it holds, which the first entries then still fix.
    /// </remarks>
    private int[][] KeptRows(IReadOnlyList<List<int>> rowsOfSystem, IReadOnlyList<double> formationEvPerAtom, bool representativesOnly)
    {
        int[] keyOfRow = _compositionKey!;
        var kept = new int[rowsOfSystem.Count][];
        var compositionsOfSystem = new int[rowsOfSystem.Count];
        Parallel.For(
            0,
            rowsOfSystem.Count,
            new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount },
            s =>
            {
                int[] rows = rowsOfSystem[s].ToArray();
                Array.Sort(rows, (a, b) => _sortRank[a].CompareTo(_sortRank[b]));
                var byComposition = new Dictionary<long[], (int First, int Lowest, int Key)>(AmountRowComparer.Instance);
                foreach (int row in rows)
                {
                    long[] amounts = _prepared[row].Amounts;
                    if (!byComposition.TryGetValue(amounts, out var known))
                    {
                        known = (row, row, byComposition.Count);
                        byComposition[amounts] = known;
                    }
                    else if (formationEvPerAtom[row] < formationEvPerAtom[known.Lowest])
                    {
                        byComposition[amounts] = (known.First, row, known.Key);
                    }

                    keyOfRow[row] = known.Key;
                }

                compositionsOfSystem[s] = byComposition.Count;
                var keep = new List<int>(2 * byComposition.Count);
                foreach ((int first, int lowest, _) in byComposition.Values)
                {
                    keep.Add(lowest);
                    if (lowest != first && !representativesOnly)
                    {
                        keep.Add(first);
                    }
                }

                foreach (int row in rows)
                {
                    _compositionFirstRank![row] = _sortRank[byComposition[_prepared[row].Amounts].First];
                }

                kept[s] = keep.ToArray();
            });

        // Keys numbered within each system, then offset so that they are unique in the dataset.
        int offset = 0;
        for (int s = 0; s < rowsOfSystem.Count; s++)
        {
            foreach (int row in rowsOfSystem[s])
            {
                keyOfRow[row] += offset;
            }

            offset += compositionsOfSystem[s];
        }

        return kept;
    }

    /// <summary>The points of every entry of a present subsystem in the columns of a system that contains it.</summary>
    private HullPoint[] AllOf(int subsystem, UInt128 system)
    {
        int width = (int)UInt128.PopCount(system);
        int[] columns = ColumnsOf(_systems[subsystem], system);
        if (_hullsOfSystem[subsystem] < 2 || _keptRowsOfSystem is not null)
        {
            // A system in one hull only (every hull's own system, most single-entry systems), or in full only in the
            // hull that reports it: nothing to share.
            return Make(CollectionsMarshal.AsSpan(_rowsOfSystem[subsystem]), columns, width);
        }

        var key = (subsystem, ColumnSet(columns), width);
        if (!_byLayout.TryGetValue(key, out HullPoint[]? points))
        {
            points = _byLayout.GetOrAdd(key, Make(CollectionsMarshal.AsSpan(_rowsOfSystem[subsystem]), columns, width));
        }

        return points;
    }

    private static UInt128 ColumnSet(int[] columns)
    {
        UInt128 columnSet = UInt128.Zero;
        foreach (int c in columns)
        {
            columnSet |= UInt128.One << c;
        }

        return columnSet;
    }

    private HullPoint[] Make(ReadOnlySpan<int> rows, int[] columns, int width)
    {
        var points = new HullPoint[rows.Length];
        for (int k = 0; k < points.Length; k++)
        {
            int row = rows[k];
            points[k] = new HullPoint(_phases[row], _entries[row], row, _prepared[row], columns, width, _sortRank[row], _compositionKey?[row] ?? -1, _compositionFirstRank?[row] ?? -1);
        }

        return points;
    }

    /// <summary>For each element of a subsystem (in bit order), its column among the elements of the system.</summary>
    private static int[] ColumnsOf(UInt128 subsystem, UInt128 system)
    {
        var columns = new int[(int)UInt128.PopCount(subsystem)];
        int column = 0, next = 0;
        for (int b = 0; next < columns.Length; b++)
        {
            UInt128 bit = UInt128.One << b;
            if ((system & bit) == UInt128.Zero)
            {
                continue;
            }

            if ((subsystem & bit) != UInt128.Zero)
            {
                columns[next++] = column;
            }

            column++;
        }

        return columns;
    }

    /// <summary>Rank of each row's id in ordinal order (ids are unique).</summary>
    private static int[] OrdinalIdRanks(IReadOnlyList<PhaseEntry> entries)
    {
        var ids = new string[entries.Count];
        var rows = new int[entries.Count];
        for (int row = 0; row < ids.Length; row++)
        {
            ids[row] = entries[row].Id;
            rows[row] = row;
        }

        Array.Sort(ids, rows, StringComparer.Ordinal);
        var rank = new int[rows.Length];
        for (int r = 0; r < rows.Length; r++)
        {
            rank[rows[r]] = r;
        }

        return rank;
    }
}
