using System.Runtime.CompilerServices;
using Hull.Core.Chemistry;

namespace Hull.Core.Thermo;

/// <summary>
/// The chemical systems present in a list of compositions: which system each row belongs to, the rows of each
/// system, which present systems lie within any set of elements, and the maximal systems (contained in no other
/// present system). An entry competes only with entries of its own system's subsystems, so a dataset is hulled once
/// per maximal system; each present system reports from exactly one of them, the smallest maximal system that
/// contains it (then the first by name). Immutable.
/// </summary>
/// <remarks>
/// Systems are bit sets over the dataset's elements (at most 118 fit in 128 bits). Entries span few elements, so
/// the present subsystems of a system are found by enumerating its subsets, not by comparing every pair of the tens
/// of thousands of systems a large dataset holds. The construction runs once per call over loops of a hundred
/// thousand rows, so its methods are compiled fully optimised from the start.
/// </remarks>
public sealed class ChemicalSystemGrouping
{
    /// <summary>Widest system whose subsets are enumerated; a wider one is compared with every present system.</summary>
    private const int MaxEnumeratedElements = 16;

    private readonly string[] _elements;
    private readonly Dictionary<string, int> _bitOf;
    private readonly Dictionary<UInt128, int> _systemIndex;
    private readonly List<UInt128> _systems;
    private readonly List<int>[] _rowsOfSystem;
    private readonly int[] _systemOfRow;
    private readonly (UInt128 Mask, string Name)[] _maximal;
    private readonly int[][] _members;
    private readonly int[] _reportingHull;
    private readonly int[] _hullsOfSystem;

    /// <summary>Groups the rows by the chemical system of their compositions.</summary>
    /// <exception cref="ArgumentNullException">When the list or one of its compositions is missing.</exception>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public ChemicalSystemGrouping(IReadOnlyList<Composition> compositions)
    {
        ArgumentNullException.ThrowIfNull(compositions);
        var present = new HashSet<string>(StringComparer.Ordinal);
        for (int row = 0; row < compositions.Count; row++)
        {
            Composition composition = compositions[row] ?? throw new ArgumentNullException(nameof(compositions), $"Row {row} has no composition.");
            foreach (string symbol in composition.Elements) present.Add(symbol);
        }

        _elements = present.Order(StringComparer.Ordinal).ToArray();
        _bitOf = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int b = 0; b < _elements.Length; b++)
        {
            _bitOf[_elements[b]] = b;
        }

        // Systems numbered in order of first appearance.
        _systemIndex = new Dictionary<UInt128, int>();
        _systems = new List<UInt128>();
        var rowsOfSystem = new List<List<int>>();
        _systemOfRow = new int[compositions.Count];
        for (int row = 0; row < compositions.Count; row++)
        {
            UInt128 mask = MaskOf(compositions[row].Elements);
            if (!_systemIndex.TryGetValue(mask, out int s))
            {
                s = _systems.Count;
                _systemIndex.Add(mask, s);
                _systems.Add(mask);
                rowsOfSystem.Add([]);
            }

            rowsOfSystem[s].Add(row);
            _systemOfRow[row] = s;
        }

        _rowsOfSystem = rowsOfSystem.ToArray();

        var contained = new bool[_systems.Count];
        var subsets = new List<int>();
        for (int s = 0; s < _systems.Count; s++)
        {
            PresentSubsets(_systems[s], subsets);
            foreach (int subset in subsets)
            {
                if (subset != s) contained[subset] = true;
            }
        }

        var maximal = new List<(UInt128 Mask, string Name)>();
        for (int s = 0; s < _systems.Count; s++)
        {
            if (!contained[s]) maximal.Add((_systems[s], string.Join("-", SymbolsOf(_systems[s]))));
        }

        // The reporting order: smallest first, then by name.
        maximal.Sort((x, y) =>
        {
            int bySize = UInt128.PopCount(x.Mask).CompareTo(UInt128.PopCount(y.Mask));
            return bySize != 0 ? bySize : string.CompareOrdinal(x.Name, y.Name);
        });
        _maximal = maximal.ToArray();
        _members = new int[_maximal.Length][];
        _reportingHull = new int[_systems.Count];
        _hullsOfSystem = new int[_systems.Count];
        Array.Fill(_reportingHull, -1);
        for (int h = 0; h < _maximal.Length; h++)
        {
            PresentSubsets(_maximal[h].Mask, subsets);
            _members[h] = subsets.ToArray();
            foreach (int member in _members[h])
            {
                if (_reportingHull[member] < 0) _reportingHull[member] = h;
                _hullsOfSystem[member]++;
            }
        }
    }

    /// <summary>Every element of the compositions, ordinally sorted.</summary>
    public IReadOnlyList<string> Elements => _elements;

    /// <summary>Number of distinct chemical systems present.</summary>
    public int SystemCount => _systems.Count;

    /// <summary>Number of maximal systems (one hull each).</summary>
    public int MaximalCount => _maximal.Length;

    /// <summary>The system of row <paramref name="row"/> (systems are numbered in order of first appearance).</summary>
    public int SystemOfRow(int row) => _systemOfRow[row];

    /// <summary>The rows of system <paramref name="system"/>, ascending.</summary>
    public IReadOnlyList<int> RowsOf(int system) => _rowsOfSystem[system];

    /// <summary>The elements of system <paramref name="system"/>, ordinally sorted.</summary>
    public IReadOnlyList<string> ElementsOf(int system) => SymbolsOf(_systems[system]);

    /// <summary>The elements of maximal system <paramref name="hull"/> (smallest first, then by name).</summary>
    public IReadOnlyList<string> MaximalElements(int hull) => SymbolsOf(_maximal[hull].Mask);

    /// <summary>The name of maximal system <paramref name="hull"/>: its elements joined by '-'.</summary>
    public string MaximalName(int hull) => _maximal[hull].Name;

    /// <summary>The present systems within maximal system <paramref name="hull"/> (itself included).</summary>
    public IReadOnlyList<int> MembersOf(int hull) => _members[hull];

    /// <summary>The maximal system that reports the entries of <paramref name="system"/>: the smallest containing it, then by name.</summary>
    public int ReportingHullOf(int system) => _reportingHull[system];

    /// <summary>How many maximal systems contain <paramref name="system"/>.</summary>
    public int HullCountOf(int system) => _hullsOfSystem[system];

    /// <summary>
    /// The present systems whose elements all lie in <paramref name="elements"/> (elements absent from every
    /// composition are allowed and change nothing), ascending.
    /// </summary>
    public IReadOnlyList<int> SystemsWithin(IEnumerable<string> elements)
    {
        ArgumentNullException.ThrowIfNull(elements);
        UInt128 mask = UInt128.Zero;
        foreach (string symbol in elements)
        {
            if (_bitOf.TryGetValue(symbol, out int bit)) mask |= UInt128.One << bit;
        }

        var found = new List<int>();
        if (mask != UInt128.Zero) PresentSubsets(mask, found);
        found.Sort();
        return found;
    }

    /// <summary>The bit set of system <paramref name="system"/> over <see cref="Elements"/>.</summary>
    internal UInt128 MaskOfSystem(int system) => _systems[system];

    /// <summary>The bit set of maximal system <paramref name="hull"/> over <see cref="Elements"/>.</summary>
    internal UInt128 MaximalMask(int hull) => _maximal[hull].Mask;

    /// <summary>The present systems as bit sets, by system number.</summary>
    internal IReadOnlyList<UInt128> SystemMasks => _systems;

    /// <summary>How many maximal systems contain each system, by system number.</summary>
    internal IReadOnlyList<int> HullCounts => _hullsOfSystem;

    /// <summary>The rows of each system, by system number.</summary>
    internal IReadOnlyList<List<int>> RowsOfSystems => _rowsOfSystem;

    /// <summary>The symbols of a bit set over <see cref="Elements"/>, ordinally sorted.</summary>
    internal string[] SymbolsOf(UInt128 mask)
    {
        var symbols = new string[(int)UInt128.PopCount(mask)];
        for (int b = 0, next = 0; next < symbols.Length; b++)
        {
            if ((mask & (UInt128.One << b)) != UInt128.Zero)
            {
                symbols[next++] = _elements[b];
            }
        }

        return symbols;
    }

    private UInt128 MaskOf(IReadOnlyList<string> symbols)
    {
        UInt128 mask = UInt128.Zero;
        for (int e = 0; e < symbols.Count; e++)
        {
            mask |= UInt128.One << _bitOf[symbols[e]];
        }

        return mask;
    }

    /// <summary>Fills <paramref name="found"/> with the present systems contained in a system (itself included).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void PresentSubsets(UInt128 system, List<int> found)
    {
        found.Clear();
        int count = (int)UInt128.PopCount(system);
        if (count > MaxEnumeratedElements)
        {
            for (int s = 0; s < _systems.Count; s++)
            {
                if ((_systems[s] & system) == _systems[s]) found.Add(s);
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

            if (_systemIndex.TryGetValue(subset, out int s)) found.Add(s);
        }
    }
}
