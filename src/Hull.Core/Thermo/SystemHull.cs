using Hull.Core.Chemistry;
using Hull.Core.Geometry;

namespace Hull.Core.Thermo;

/// <summary>
/// The convex hull of an energy per atom over one chemical system: over its elements, or over compound end-members
/// (pseudo-binary, pseudo-ternary, ...). The energy is that of the hull's <see cref="Axis"/>: formation energy for
/// the closed hull, or any other energy measured from the elemental references (a grand potential over the closed
/// elements, a free energy at a temperature, one sample of an uncertain energy). Built once from a list of entries;
/// reports every entry's stability, the stable phases, facets with their chemical potentials and tie-lines, and
/// answers queries at any composition. Results do not depend on the order of the entries. Immutable and safe to share between threads.
/// </summary>
/// <remarks>
/// Over elements, an element with no pure entry gets a synthetic reference point at formation energy 0 (id = the
/// element symbol, <see cref="HullPhase.IsSynthetic"/> true): with formation energies that is the definition of the
/// reference state, and with total energies it is the explicit reference the element must then have. An element
/// with pure entries has its corner at its lowest entry. Over end-members, each end-member needs an entry of its
/// reduced composition.
/// </remarks>
public sealed partial class SystemHull
{
    private readonly ComponentSpace _space;
    private readonly HullAxis _axis;
    private readonly HullPoint[] _points;
    private readonly IHullStability _hull;
    private readonly Lazy<LowerHull> _facetHull;
    private readonly double[]? _endMemberCornerEvPerAtom;
    private readonly Lazy<IReadOnlyList<EntryStability>> _entries;
    private readonly Lazy<Dictionary<string, EntryStability>> _entryById;
    private readonly Lazy<IReadOnlyList<PhaseFacet>> _facets;
    private readonly Lazy<IReadOnlyList<TieLine>> _tieLines;
    private readonly Lazy<IReadOnlyList<HullPhase>> _stablePhases;
    private readonly Lazy<SystemCoverage> _coverage;

    /// <summary>The hull of entries over elements (the union of the entries' elements unless given).</summary>
    /// <param name="entries">Entries whose elements lie in the system; ids unique.</param>
    /// <param name="references">Explicit elemental references (eV/atom) overriding the lowest pure-element entries.</param>
    /// <param name="elements">The system's elements; default: every element of the entries.</param>
    /// <exception cref="ThermoInputException">Bad rows, missing references, or an entry outside the system.</exception>
    public static SystemHull OverElements(
        IReadOnlyList<PhaseEntry> entries, ElementalReferences? references = null, IReadOnlyList<string>? elements = null)
    {
        FormationEnergySet formation = FormationEnergies.Compute(entries, references);
        string[] symbols;
        if (elements is null)
        {
            symbols = entries.SelectMany(e => e.Composition.Elements).Distinct().Order(StringComparer.Ordinal).ToArray();
            if (symbols.Length == 0)
            {
                throw new ThermoInputException("A hull needs at least one entry or an explicit list of elements.");
            }
        }
        else
        {
            foreach (string symbol in elements)
            {
                if (!ElementTable.IsSymbol(symbol))
                {
                    throw new ThermoInputException($"System element '{symbol}' is not an element symbol.", element: symbol);
                }
            }

            symbols = elements.Distinct().Order(StringComparer.Ordinal).ToArray();
            if (symbols.Length == 0)
            {
                throw new ThermoInputException("A hull needs at least one element.");
            }
        }

        return new SystemHull(
            HullAxis.FormationEnergy, new ComponentSpace.OverElements(symbols), Inputs(entries, formation), formation.References);
    }

    /// <summary>
    /// The hull of entries already placed on <paramref name="axis"/> (their energies are what is hulled), over the
    /// system's elements, or over its closed elements when the axis has open ones.
    /// </summary>
    /// <param name="axis">What the energies are; carried on every result.</param>
    /// <param name="entries">Entries with their axis energies; ids unique.</param>
    /// <param name="elements">The system's (closed) elements; default: every element of the entries that is not open.</param>
    /// <param name="references">The elemental references behind the energies, reported as used; default none.</param>
    /// <exception cref="ThermoInputException">Bad rows, an open element among the system's elements, or an entry outside the system.</exception>
    public static SystemHull OnAxis(
        HullAxis axis,
        IReadOnlyList<HullAxisEntry> entries,
        IReadOnlyList<string>? elements = null,
        IReadOnlyList<ElementReference>? references = null)
    {
        ArgumentNullException.ThrowIfNull(axis);
        ArgumentNullException.ThrowIfNull(entries);
        for (int row = 0; row < entries.Count; row++)
        {
            if (entries[row] is null)
            {
                throw new ThermoInputException($"Row {row} is empty: every row needs an entry and its axis energy.", rowIndex: row);
            }
        }

        EntryList.Validate(entries.Select(e => e.Entry).ToArray());
        string[] symbols = elements is null
            ? entries.SelectMany(e => e.Entry.Composition.Elements).Where(s => !axis.IsOpen(s)).Distinct().Order(StringComparer.Ordinal).ToArray()
            : elements.Distinct().Order(StringComparer.Ordinal).ToArray();
        foreach (string symbol in symbols)
        {
            if (!ElementTable.IsSymbol(symbol))
            {
                throw new ThermoInputException($"System element '{symbol}' is not an element symbol.", element: symbol);
            }

            if (axis.IsOpen(symbol))
            {
                throw new ThermoInputException(
                    $"Element {symbol} is open on the axis ({axis.DisplayName}); list only the closed elements of the system.", element: symbol);
            }
        }

        if (symbols.Length == 0)
        {
            throw new ThermoInputException("A hull needs at least one closed element: give entries with one, or the list of elements.");
        }

        ComponentSpace space = axis.OpenElements.Count == 0
            ? new ComponentSpace.OverElements(symbols)
            : new ComponentSpace.OverClosedElements(symbols, axis.OpenElements);
        var inputs = entries.Select((e, row) => (e.Entry, row, e.AxisEnergyEvPerAtom, e.FormationEnergyEvPerAtom)).ToArray();
        return new SystemHull(axis, space, inputs, references ?? []);
    }

    /// <summary>The hull of entries over compound end-members; every entry must be a non-negative combination of them.</summary>
    /// <param name="entries">Entries on the end-members' cone, including at least one entry of each end-member; ids unique.</param>
    /// <param name="basis">The end-members (the hull's components, in this order).</param>
    /// <param name="references">Explicit elemental references (eV/atom) for total energies.</param>
    /// <exception cref="ThermoInputException">Bad rows, missing references, an entry outside the cone, or an end-member without entry.</exception>
    public static SystemHull OverEndMembers(
        IReadOnlyList<PhaseEntry> entries, EndMemberBasis basis, ElementalReferences? references = null)
    {
        ArgumentNullException.ThrowIfNull(basis);
        FormationEnergySet formation = FormationEnergies.Compute(entries, references);
        return new SystemHull(
            HullAxis.FormationEnergy, new ComponentSpace.OverEndMembers(basis), Inputs(entries, formation), formation.References);
    }

    private static (PhaseEntry Entry, int Row, double AxisEvPerAtom, double? FormationEvPerAtom)[] Inputs(
        IReadOnlyList<PhaseEntry> entries, FormationEnergySet formation) =>
        entries.Select((e, row) => (e, row, formation.FormationEnergiesEvPerAtom[row], (double?)formation.FormationEnergiesEvPerAtom[row])).ToArray();

    /// <summary>Builds the hull from entries with their axis energies already known; ids must be unique.</summary>
    internal SystemHull(
        HullAxis axis,
        ComponentSpace space,
        IReadOnlyList<(PhaseEntry Entry, int Row, double AxisEvPerAtom, double? FormationEvPerAtom)> inputs,
        IReadOnlyList<ElementReference> references)
        : this(axis, space, MapInputs(space, inputs), references)
    {
    }

    /// <summary>
    /// Builds the hull from the points of its entries, in any order; synthetic corners are added here. The hull
    /// takes the array over (it is sorted in place).
    /// </summary>
    /// <param name="axis">What the points' energies are.</param>
    /// <param name="space">The components.</param>
    /// <param name="points">The entries' points (synthetic corners are added here).</param>
    /// <param name="references">The elemental references used.</param>
    /// <param name="onDemand">Work out each point's stability when first asked (a dataset's hull reports only some of
    /// its points); such a hull is for one thread only.</param>
    /// <param name="engineLike">The engine of a hull over the same compositions at other energies (a sample's
    /// plain hull), whose choice of engine this one follows; null to choose afresh.</param>
    internal SystemHull(
        HullAxis axis, ComponentSpace space, HullPoint[] points, IReadOnlyList<ElementReference> references, bool onDemand = false,
        IHullStability? engineLike = null)
    {
        _axis = axis;
        _space = space;
        References = references;

        // Canonical order (by id; a synthetic reference after an entry of the same id) makes every tie-break of the
        // engine, and so every result, independent of the input order. Ids are unique, so the order is total.
        _points = WithCornerPoints(space, points);
        SortCanonically(_points);
        HullInput input = GroupByCompositionKey(_points, space.Names.Count) ?? CheckPoints(_points);
        _hull = engineLike is null ? HullStability.Build(input, onDemand) : HullStability.BuildLike(input, engineLike);
        // Facets are built on first use only: in many components they outnumber the points by far, and stability
        // does not need them.
        _facetHull = new Lazy<LowerHull>(() => _hull as LowerHull ?? LowerHull.Build(input));

        if (space is ComponentSpace.OverEndMembers)
        {
            _endMemberCornerEvPerAtom = new double[space.Names.Count];
            foreach (int v in _hull.VertexPoints)
            {
                if (_points[v].IsPureComponent)
                {
                    _endMemberCornerEvPerAtom[_points[v].PureComponent] = _points[v].AxisEnergyEvPerAtom;
                }
            }
        }

        _entries = new Lazy<IReadOnlyList<EntryStability>>(() =>
            Enumerable.Range(0, _points.Length)
                .Where(i => _points[i].Entry is not null)
                .OrderBy(i => _points[i].RowIndex)
                .Select(ComputeEntry)
                .ToArray());
        _entryById = new Lazy<Dictionary<string, EntryStability>>(
            () => _entries.Value.ToDictionary(e => e.Id, StringComparer.Ordinal));
        _facets = new Lazy<IReadOnlyList<PhaseFacet>>(BuildFacets);
        _tieLines = new Lazy<IReadOnlyList<TieLine>>(BuildTieLines);
        _stablePhases = new Lazy<IReadOnlyList<HullPhase>>(() => _hull.VertexPoints.Select(v => _points[v].Phase).ToArray());
        _coverage = new Lazy<SystemCoverage>(BuildCoverage);
    }

    private static HullPoint[] MapInputs(
        ComponentSpace space, IReadOnlyList<(PhaseEntry Entry, int Row, double AxisEvPerAtom, double? FormationEvPerAtom)> inputs)
    {
        var points = new HullPoint[inputs.Count];
        for (int k = 0; k < points.Length; k++)
        {
            (PhaseEntry entry, int row, double axisEnergy, double? formation) = inputs[k];
            if (!space.TryMap(entry.Composition, out Rational[] atoms, out string failure))
            {
                throw new ThermoInputException(
                    $"Entry '{entry.Id}': {entry.Composition.Formula} {failure}", entryId: entry.Id, rowIndex: row);
            }

            var phase = new HullPhase(entry.Id, isSynthetic: false, entry.Composition, axisEnergy, formation);
            points[k] = new HullPoint(phase, entry, row, atoms);
        }

        return points;
    }

    private static HullInput CheckPoints(HullPoint[] points)
    {
        var amounts = new long[points.Length][];
        var energies = new double[points.Length];
        for (int i = 0; i < points.Length; i++)
        {
            amounts[i] = points[i].Amounts;
            energies[i] = points[i].AxisEnergyEvPerAtom;
        }

        return HullInput.Check(amounts, energies);
    }

    /// <summary>Composition of each composition key in the hull being grouped on this thread (-1: not seen); reset after each hull.</summary>
    [ThreadStatic]
    private static int[]? _localOfKey;

    /// <summary>
    /// The engine's input from the points' dataset composition keys (see <see cref="HullPoint.CompositionKey"/>),
    /// or null when an entry has none. Compositions are numbered in the order their first entries have among all
    /// the dataset's entries (<see cref="HullPoint.CompositionFirstRank"/>), which is their order of first
    /// occurrence in a hull of every entry, also where this hull holds only some of them. A synthetic corner (an
    /// element has one only when no entry is made of it alone) is a composition of its own, placed after the entry
    /// before it.
    /// </summary>
    private static HullInput? GroupByCompositionKey(HullPoint[] points, int componentCount)
    {
        int largestKey = -1;
        foreach (HullPoint point in points)
        {
            if (point.Entry is null)
            {
                continue;
            }

            if (point.CompositionKey < 0)
            {
                return null;
            }

            largestKey = Math.Max(largestKey, point.CompositionKey);
        }

        int[] localOfKey = _localOfKey is { } known && known.Length > largestKey ? known : GrowKeyTable(largestKey + 1);
        var compositionOf = new int[points.Length];
        var energies = new double[points.Length];
        var firstPoints = new List<int>();
        // Per composition in order of appearance here: its place (twice the first rank; a corner's is odd) and number.
        var order = new List<long>();
        long lastRank = -1;
        bool inOrder = true;
        for (int i = 0; i < points.Length; i++)
        {
            HullPoint point = points[i];
            energies[i] = point.AxisEnergyEvPerAtom;
            int key = point.CompositionKey;
            int local = point.Entry is null ? -1 : localOfKey[key];
            if (local < 0)
            {
                local = firstPoints.Count;
                firstPoints.Add(i);
                long place = point.Entry is null ? 2 * lastRank + 1 : 2L * point.CompositionFirstRank;
                inOrder &= order.Count == 0 || (order[^1] >> 32) <= place;
                order.Add((place << 32) | (uint)local);
                if (point.Entry is not null)
                {
                    localOfKey[key] = local;
                }
            }

            if (point.Entry is not null)
            {
                lastRank = point.SortRank;
            }

            compositionOf[i] = local;
        }

        int count = firstPoints.Count;
        var renumbered = new int[count];
        if (!inOrder)
        {
            // Places are distinct, but a corner after an entry may share one with the next corner: the number breaks it.
            order.Sort();
        }

        for (int c = 0; c < count; c++)
        {
            renumbered[(int)(order[c] & uint.MaxValue)] = c;
        }

        for (int i = 0; i < compositionOf.Length; i++)
        {
            compositionOf[i] = renumbered[compositionOf[i]];
        }

        var reducedRows = new long[count * componentCount];
        foreach (int p in firstPoints)
        {
            HullPoint first = points[p];
            first.Amounts.CopyTo(reducedRows, compositionOf[p] * componentCount);
            if (first.Entry is not null)
            {
                localOfKey[first.CompositionKey] = -1;
            }
        }

        return HullInput.FromGrouped(componentCount, energies, compositionOf, count, reducedRows);
    }

    private static int[] GrowKeyTable(int keys)
    {
        var table = new int[Math.Max(keys, 2 * (_localOfKey?.Length ?? 0))];
        Array.Fill(table, -1);
        _localOfKey = table;
        return table;
    }

    private static void SortCanonically(HullPoint[] points)
    {
        var ranks = new int[points.Length];
        for (int i = 0; i < points.Length; i++)
        {
            ranks[i] = points[i].SortRank;
            if (ranks[i] < 0)
            {
                Array.Sort(points, CanonicalOrder);
                return;
            }
        }

        // Every point carries its id rank (a dataset's hull): sorting by the integer keys is the same order, faster,
        // and fastest as plain 64-bit keys (rank, then index; ranks are unique) with one permutation after.
        var keys = new long[points.Length];
        for (int i = 0; i < keys.Length; i++) keys[i] = ((long)ranks[i] << 32) | (uint)i;
        Array.Sort(keys);
        var before = (HullPoint[])points.Clone();
        for (int i = 0; i < keys.Length; i++) points[i] = before[(int)(keys[i] & uint.MaxValue)];
    }

    /// <summary>By id (ordinal; by rank where both points carry one), then a synthetic reference after an entry.</summary>
    private static int CanonicalOrder(HullPoint a, HullPoint b)
    {
        if (a.SortRank >= 0 && b.SortRank >= 0)
        {
            return a.SortRank.CompareTo(b.SortRank);
        }

        int byId = string.CompareOrdinal(a.Phase.Id, b.Phase.Id);
        return byId != 0 ? byId : a.Phase.IsSynthetic.CompareTo(b.Phase.IsSynthetic);
    }

    /// <summary>Number of points (entries and synthetic references) in canonical order.</summary>
    internal int PointCount => _points.Length;

    /// <summary>Row of the entry at canonical index <paramref name="i"/> (-1 for a synthetic reference).</summary>
    internal int RowOfPoint(int i) => _points[i].RowIndex;

    /// <summary>What the hull's energies are: quantity, name, unit and which atoms they count.</summary>
    public HullAxis Axis => _axis;

    /// <summary>The components (element symbols, or end-member formulas) in hull order.</summary>
    public IReadOnlyList<string> Components => _space.Names;

    /// <summary>The components joined by '-', e.g. "Fe-O".</summary>
    public string SystemName => _space.SystemName;

    /// <summary>The end-members when the hull is over compound end-members; null over elements.</summary>
    public EndMemberBasis? EndMembers => (_space as ComponentSpace.OverEndMembers)?.Basis;

    /// <summary>The elemental references used for total energies, sorted by symbol.</summary>
    public IReadOnlyList<ElementReference> References { get; }

    /// <summary>Which components have entries of their own, which stand at 0 by definition, and how many compounds compete.</summary>
    public SystemCoverage Coverage => _coverage.Value;

    /// <summary>Every entry's stability, in the order the entries were given.</summary>
    public IReadOnlyList<EntryStability> Entries => _entries.Value;

    /// <summary>The stable phases (hull vertices), sorted by id; synthetic references included and flagged.</summary>
    public IReadOnlyList<HullPhase> StablePhases => _stablePhases.Value;

    /// <summary>The hull facets, each with its corner phases and chemical potentials.</summary>
    public IReadOnlyList<PhaseFacet> Facets => _facets.Value;

    /// <summary>
    /// Pairs of stable phases that coexist: both corners of one face of the hull (a facet, or facets exactly on one
    /// plane), without repeats, sorted by the first then the second id.
    /// </summary>
    public IReadOnlyList<TieLine> TieLines => _tieLines.Value;

    /// <summary>The stability of the entry with the given id.</summary>
    /// <exception cref="KeyNotFoundException">When no entry has that id.</exception>
    public EntryStability GetEntry(string id) =>
        _entryById.Value.TryGetValue(id, out EntryStability? entry)
            ? entry
            : throw new KeyNotFoundException($"No entry '{id}' in the hull of {SystemName}.");

    /// <summary>The hull energy and decomposition at any composition of the system (per one formula unit as written).</summary>
    /// <exception cref="ThermoInputException">When the composition lies outside the system.</exception>
    public Decomposition DecompositionAt(Composition composition)
    {
        Rational[] atoms = MapQuery(composition);
        HullPosition position = _hull.Locate(FractionsOf(atoms));
        return BuildDecomposition(composition, atoms, position);
    }

    /// <summary>
    /// The chemical potential of each component (in <see cref="Components"/> order) at a composition of the system:
    /// eV per atom of that component on the hull's axis (on the closed formation-energy hull: relative to its
    /// reference, so the potentials at a pure component's own corner are 0), those of a hull facet that holds the composition, so that the hull energy there
    /// is Σ_k mu_k x_k. Unique inside a facet; where facets meet (a tie-line, a stable phase, the edge of the system)
    /// one facet's, and the set of all of them is the composition's chemical-potential window
    /// (<see cref="IHullStability.ChemicalPotentialsEvPerAtomAt"/>).
    /// </summary>
    /// <exception cref="ThermoInputException">When the composition lies outside the system.</exception>
    public IReadOnlyList<double> ChemicalPotentialsEvPerAtomAt(Composition composition) =>
        Array.AsReadOnly(_hull.ChemicalPotentialsEvPerAtomAt(FractionsOf(MapQuery(composition))));

    /// <summary>The hull energy on the hull's axis (on the closed hull: formation energy, eV/atom) at any composition of the system.</summary>
    public double HullEnergyEvPerAtomAt(Composition composition) => DecompositionAt(composition).HullEnergyEvPerAtom;

    /// <summary>
    /// How a phase of this composition and energy on the hull's axis (on the closed hull: its formation energy, eV/atom)
    /// would sit against the hull, without adding it.
    /// </summary>
    /// <exception cref="ThermoInputException">When the composition lies outside the system or the energy is not finite.</exception>
    public CandidateStability Assess(Composition composition, double axisEnergyEvPerAtom)
    {
        if (!double.IsFinite(axisEnergyEvPerAtom))
        {
            throw new ThermoInputException($"The {_axis.DisplayName} of candidate {composition?.Formula} is not finite.");
        }

        Decomposition decomposition = DecompositionAt(composition!);
        double relative = axisEnergyEvPerAtom - decomposition.HullEnergyEvPerAtom;
        if (Math.Abs(relative) <= HullTolerances.EnergyEvPerAtom)
        {
            relative = 0.0;
        }

        return new CandidateStability(composition!, _axis, axisEnergyEvPerAtom, relative, decomposition);
    }

    /// <summary>The stability of the point at canonical index <paramref name="i"/>, which must be an entry.</summary>
    internal EntryStability ComputeEntry(int i)
    {
        HullPoint point = _points[i];
        PhaseEntry entry = point.Entry ?? throw new InvalidOperationException("A synthetic reference has no stability record.");
        HullPosition position = _hull.LocatePoint(i);
        double above = point.AxisEnergyEvPerAtom - position.HullEnergyEvPerAtom;
        if (!(above > HullTolerances.EnergyEvPerAtom))
        {
            above = 0.0;
        }

        double? fromEndMembers = null;
        if (_endMemberCornerEvPerAtom is not null)
        {
            double corners = 0.0;
            for (int k = 0; k < point.Fractions.Length; k++)
            {
                corners += point.Fractions[k] * _endMemberCornerEvPerAtom[k];
            }

            fromEndMembers = point.AxisEnergyEvPerAtom - corners;
        }

        bool isVertex = _hull.IsVertex(i);
        // Only a vertex carries its composition's margin; an entry that only touches the hull (an exact duplicate or a
        // polymorph tied with the vertex, an entry inside a facet or on a coplanar face) reads 0, so that the margin
        // is counted once and a negative value always means "a stable phase".
        double? decompositionEnergy = above != 0.0 || point.IsPureComponent ? null
            : isVertex ? DecompositionEnergyEvPerAtom(i)
            : 0.0;
        return new EntryStability(
            entry,
            point.RowIndex,
            SystemName,
            _axis,
            point.AxisEnergyEvPerAtom,
            point.Phase.FormationEnergyEvPerAtom,
            fromEndMembers,
            point.Fractions,
            above,
            isVertex,
            BuildDecomposition(entry.Composition, point.ComponentAtoms, position),
            decompositionEnergy);
    }

    /// <summary>
    /// Decomposition energy computed the slow way, by rebuilding the whole hull without the entry's reduced
    /// composition; a check on the fast path. Null where the fast path gives null, 0 for an on-hull non-vertex.
    /// </summary>
    internal double? DecompositionEnergyByFullRebuild(string id)
    {
        int i = Array.FindIndex(_points, p => p.Entry is not null && string.Equals(p.Phase.Id, id, StringComparison.Ordinal));
        HullPoint point = _points[i];
        if (point.IsPureComponent || _hull.EnergyAboveHullEvPerAtom(i) > HullTolerances.EnergyEvPerAtom)
        {
            return null;
        }

        if (!_hull.IsVertex(i))
        {
            return 0.0;
        }

        int[] others = Enumerable.Range(0, _points.Length)
            .Where(j => !_points[j].HasSameCompositionAs(point))
            .ToArray();
        double hullWithout = HullEnergyOfSubset(others, point.Fractions);
        return SnapDecompositionEnergy(point.AxisEnergyEvPerAtom - hullWithout);
    }

    private double DecompositionEnergyEvPerAtom(int i) =>
        // Both engines know the hull at a composition without it (the program engine solved exactly that; the
        // incremental hull answers from the vertex's star).
        SnapDecompositionEnergy(_points[i].AxisEnergyEvPerAtom - _hull.HullEnergyWithoutCompositionEvPerAtom(i)!.Value);

    // An entry on the hull cannot lie above the hull without its composition; differences within the hull
    // tolerance are ties (an entry that only touches the hull), reported as exactly 0.
    private static double SnapDecompositionEnergy(double value) =>
        value >= -HullTolerances.EnergyEvPerAtom ? 0.0 : value;

    private double HullEnergyOfSubset(int[] subset, double[] fractions)
    {
        var amounts = new long[subset.Length][];
        var energies = new double[subset.Length];
        for (int k = 0; k < subset.Length; k++)
        {
            amounts[k] = _points[subset[k]].Amounts;
            energies[k] = _points[subset[k]].AxisEnergyEvPerAtom;
        }

        return LowerHull.Build(amounts, energies).Locate(fractions).HullEnergyEvPerAtom;
    }

    private Rational[] MapQuery(Composition composition)
    {
        ArgumentNullException.ThrowIfNull(composition);
        if (!_space.TryMap(composition, out Rational[] atoms, out string failure))
        {
            throw new ThermoInputException($"{composition.Formula} {failure}");
        }

        return atoms;
    }

    private static double[] FractionsOf(Rational[] atoms)
    {
        Rational total = Rational.Zero;
        foreach (Rational a in atoms)
        {
            total += a;
        }

        return HullPoint.FractionsOf(atoms, total);
    }

    /// <summary>
    /// Products and coefficients of a decomposition. The engine names the hull phases and their weights in floating
    /// point; the coefficients are then solved exactly from the compositions (the phases of one facet are linearly
    /// independent, so the balance is unique). Floating-point weights are the fallback should the exact balance fail.
    /// </summary>
    private Decomposition BuildDecomposition(Composition composition, Rational[] targetAtoms, HullPosition position)
    {
        Rational targetTotal = Rational.Zero;
        foreach (Rational a in targetAtoms)
        {
            targetTotal += a;
        }

        IReadOnlyList<int> vertices = position.VertexPoints;
        var products = new List<(int Point, double AtomFraction, double FormulaUnits, Rational? Exact)>(vertices.Count);

        // Phases containing a component the target lacks can only carry weight 0 exactly.
        var candidates = new List<int>(vertices.Count);
        var columns = new List<Rational[]>(vertices.Count);
        for (int k = 0; k < vertices.Count; k++)
        {
            if (WithinSupport(_points[vertices[k]].ComponentAtoms, targetAtoms))
            {
                candidates.Add(vertices[k]);
                columns.Add(_points[vertices[k]].ComponentAtoms);
            }
        }

        if (!TryExactProducts(candidates, columns, targetAtoms, targetTotal, products))
        {
            double totalAtoms = targetTotal.ToDouble();
            for (int k = 0; k < vertices.Count; k++)
            {
                HullPoint product = _points[vertices[k]];
                double formulaUnits = position.AtomFractions[k] * totalAtoms / product.AtomsPerFormulaUnit.ToDouble();
                products.Add((vertices[k], position.AtomFractions[k], formulaUnits, null));
            }
        }

        // By point index, which follows the id order (each point appears once).
        products.Sort((a, b) => a.Point.CompareTo(b.Point));
        var ordered = new DecompositionProduct[products.Count];
        for (int k = 0; k < ordered.Length; k++)
        {
            (int p, double atomFraction, double formulaUnits, Rational? coefficient) = products[k];
            ordered[k] = new DecompositionProduct(_points[p].Phase, atomFraction, formulaUnits, coefficient);
        }

        return new Decomposition(composition, _axis, position.HullEnergyEvPerAtom, ordered);
    }

    /// <summary>
    /// The products of an exactly balanced reaction, or false (nothing added) when the balance has no non-negative
    /// solution or a coefficient does not fit in a 64-bit fraction.
    /// </summary>
    private bool TryExactProducts(
        List<int> candidates,
        List<Rational[]> columns,
        Rational[] targetAtoms,
        Rational targetTotal,
        List<(int Point, double AtomFraction, double FormulaUnits, Rational? Exact)> products)
    {
        var exactProducts = new List<(int, double, double, Rational?)>(candidates.Count);
        try
        {
            Rational[]? exact = ExactLinearAlgebra.Solve(columns, targetAtoms);
            if (exact is null || !Array.TrueForAll(exact, c => c.Sign >= 0))
            {
                return false;
            }

            for (int k = 0; k < candidates.Count; k++)
            {
                if (exact[k].IsZero)
                {
                    continue;
                }

                HullPoint product = _points[candidates[k]];
                double fraction = (exact[k] * product.AtomsPerFormulaUnit / targetTotal).ToDouble();
                exactProducts.Add((candidates[k], fraction, exact[k].ToDouble(), exact[k]));
            }
        }
        catch (OverflowException)
        {
            // Coefficients beyond 64-bit fractions: the floating-point weights answer instead.
            return false;
        }

        products.AddRange(exactProducts);
        return true;
    }

    private static bool WithinSupport(Rational[] candidate, Rational[] target)
    {
        for (int k = 0; k < candidate.Length; k++)
        {
            if (!candidate[k].IsZero && target[k].IsZero)
            {
                return false;
            }
        }

        return true;
    }

    /// <summary>The points, followed by a synthetic reference for each element without a pure entry.</summary>
    private static HullPoint[] WithCornerPoints(ComponentSpace space, HullPoint[] points)
    {
        var hasPure = new bool[space.Names.Count];
        foreach (HullPoint point in points)
        {
            if (point.IsPureComponent)
            {
                hasPure[point.PureComponent] = true;
            }
        }

        int missing = hasPure.Count(has => !has);
        if (missing == 0)
        {
            return points;
        }

        var all = new HullPoint[points.Length + missing];
        points.CopyTo(all, 0);
        int next = points.Length;
        for (int k = 0; k < space.Names.Count; k++)
        {
            if (hasPure[k])
            {
                continue;
            }

            string name = space.Names[k];
            if (space is ComponentSpace.OverEndMembers)
            {
                throw new ThermoInputException(
                    $"End-member {name} has no entry: a hull over end-members needs at least one entry of each end-member's reduced composition.");
            }

            // An element without entries sits at its reference state: 0 on every axis (all are measured from the references).
            Composition single = Composition.Parse(name);
            var atoms = new Rational[space.Names.Count];
            atoms[k] = Rational.One;
            all[next++] = new HullPoint(new HullPhase(name, isSynthetic: true, single, 0.0, 0.0), null, -1, atoms);
        }

        return all;
    }

    private SystemCoverage BuildCoverage()
    {
        var pure = new int[_space.Names.Count];
        int entries = 0;
        foreach (HullPoint point in _points)
        {
            if (point.Entry is null)
            {
                continue;
            }

            entries++;
            if (point.IsPureComponent)
            {
                pure[point.PureComponent]++;
            }
        }

        return CoverageOf(pure, entries);
    }

    /// <summary>
    /// The coverage from counts of entries: <paramref name="pure"/>[k] of component k alone, and
    /// <paramref name="entries"/> in all (synthetic corners not counted). A dataset's hull that holds only some of
    /// its subsystems' entries reports the counts of all of them.
    /// </summary>
    internal SystemCoverage CoverageOf(int[] pure, int entries)
    {
        int compounds = entries - pure.Sum();
        var components = new ComponentCoverage[pure.Length];
        for (int k = 0; k < pure.Length; k++)
        {
            string name = _space.Names[k];
            ElementReference? reference = References.FirstOrDefault(r => string.Equals(r.Symbol, name, StringComparison.Ordinal));
            components[k] = new ComponentCoverage(name, pure[k], reference);
        }

        return new SystemCoverage(SystemName, components, entries, compounds);
    }

    private IReadOnlyList<PhaseFacet> BuildFacets() =>
        _facetHull.Value.Facets
            .Select(f => new PhaseFacet(
                f.VertexPoints.Order().Select(v => _points[v].Phase).ToArray(),
                Components,
                _axis,
                f.ChemicalPotentialsEvPerAtom.ToArray()))
            .ToArray();

    private IReadOnlyList<TieLine> BuildTieLines()
    {
        var pairs = new SortedSet<(int, int)>();
        // Per face, not per facet: phases exactly coplanar on the hull all coexist, whichever diagonal the
        // triangulation drew between them.
        foreach (IReadOnlyList<int> corners in _facetHull.Value.CoplanarFaces())
        {
            for (int a = 0; a < corners.Count; a++)
            {
                for (int b = a + 1; b < corners.Count; b++)
                {
                    pairs.Add((corners[a], corners[b]));
                }
            }
        }

        // Canonical indices follow the id order, so sorting the index pairs sorts the tie-lines by id.
        return pairs.Select(p => new TieLine(_points[p.Item1].Phase, _points[p.Item2].Phase)).ToArray();
    }
}
