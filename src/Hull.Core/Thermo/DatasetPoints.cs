using System.Collections.Concurrent;

namespace Hull.Core.Thermo;

/// <summary>
/// The hull points of a dataset's chemical systems, made once per layout. A subsystem's points are the same in
/// every hull that places its elements in the same columns (a binary sits in a hundred quaternary hulls but in only
/// a few layouts), so they are shared between those hulls instead of being rebuilt for each. Safe for parallel use.
/// </summary>
internal sealed class DatasetPoints
{
    private readonly IReadOnlyList<PhaseEntry> _entries;
    private readonly PreparedCoordinates[] _prepared;
    private readonly HullPhase[] _phases;
    private readonly int[] _sortRank;
    private readonly IReadOnlyList<UInt128> _systems;
    private readonly IReadOnlyList<List<int>> _rowsOfSystem;
    private readonly IReadOnlyList<int> _hullsOfSystem;
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
    }

    /// <summary>The points of a present subsystem's entries in the columns of a system that contains it.</summary>
    public HullPoint[] Of(int subsystem, UInt128 system)
    {
        int width = (int)UInt128.PopCount(system);
        int[] columns = ColumnsOf(_systems[subsystem], system);
        if (_hullsOfSystem[subsystem] < 2)
        {
            // A system in one hull only (every hull's own system, most single-entry systems): nothing to share.
            return Make(subsystem, columns, width);
        }

        UInt128 columnSet = UInt128.Zero;
        foreach (int c in columns)
        {
            columnSet |= UInt128.One << c;
        }

        var key = (subsystem, columnSet, width);
        if (!_byLayout.TryGetValue(key, out HullPoint[]? points))
        {
            points = _byLayout.GetOrAdd(key, Make(subsystem, columns, width));
        }

        return points;
    }

    private HullPoint[] Make(int subsystem, int[] columns, int width)
    {
        List<int> rows = _rowsOfSystem[subsystem];
        var points = new HullPoint[rows.Count];
        for (int k = 0; k < points.Length; k++)
        {
            int row = rows[k];
            points[k] = new HullPoint(_phases[row], _entries[row], row, _prepared[row], columns, width, _sortRank[row]);
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
