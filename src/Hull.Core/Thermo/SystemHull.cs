using Hull.Core.Chemistry;
using Hull.Core.Geometry;

namespace Hull.Core.Thermo;

/// <summary>
/// The convex hull of formation energy per atom over one chemical system: over its elements, or over compound
/// end-members (pseudo-binary, pseudo-ternary, ...). Built once from a list of entries; reports every entry's
/// stability, the stable phases, facets with their chemical potentials and tie-lines, and answers queries at any
/// composition. Results do not depend on the order of the entries. Immutable and safe to share between threads.
/// </summary>
/// <remarks>
/// Over elements, an element with no pure entry gets a synthetic reference point at formation energy 0 (id = the
/// element symbol, <see cref="HullPhase.IsSynthetic"/> true): with formation energies that is the definition of the
/// reference state, and with total energies it is the explicit reference the element must then have. An element
/// with pure entries has its corner at its lowest entry. Over end-members, each end-member needs an entry of its
/// reduced composition.
/// </remarks>
public sealed class SystemHull
{
    private readonly ComponentSpace _space;
    private readonly HullPoint[] _points;
    private readonly LowerHull _hull;
    private readonly HashSet<int> _vertexSet;
    private readonly double[]? _endMemberCornerEvPerAtom;
    private readonly Lazy<IReadOnlyList<EntryStability>> _entries;
    private readonly Lazy<Dictionary<string, EntryStability>> _entryById;
    private readonly Lazy<IReadOnlyList<PhaseFacet>> _facets;
    private readonly Lazy<IReadOnlyList<TieLine>> _tieLines;

    // Filled on demand by the single thread that computes entries (under _entries, or a dataset worker).
    private HullPosition?[]? _positions;
    private List<int>[]? _facetsOfVertex;
    private List<int>[]? _pointsInFacet;
    private int[]? _pureCorners;
    private readonly Dictionary<string, double> _decompositionEnergyByKey = new(StringComparer.Ordinal);

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
            new ComponentSpace.OverElements(symbols), Inputs(entries, formation), formation.References);
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
        return new SystemHull(new ComponentSpace.OverEndMembers(basis), Inputs(entries, formation), formation.References);
    }

    private static (PhaseEntry Entry, int Row, double FormationEvPerAtom)[] Inputs(
        IReadOnlyList<PhaseEntry> entries, FormationEnergySet formation) =>
        entries.Select((e, row) => (e, row, formation.FormationEnergiesEvPerAtom[row])).ToArray();

    /// <summary>Builds the hull from entries with their formation energies already known; ids must be unique.</summary>
    internal SystemHull(
        ComponentSpace space,
        IReadOnlyList<(PhaseEntry Entry, int Row, double FormationEvPerAtom)> inputs,
        IReadOnlyList<ElementReference> references)
    {
        _space = space;
        References = references;
        var points = new List<HullPoint>(inputs.Count + space.Names.Count);
        foreach ((PhaseEntry entry, int row, double formation) in inputs)
        {
            if (!space.TryMap(entry.Composition, out BigFraction[] atoms, out string failure))
            {
                throw new ThermoInputException(
                    $"Entry '{entry.Id}' (row {row}): {entry.Composition.Formula} {failure}", entryId: entry.Id, rowIndex: row);
            }

            var phase = new HullPhase(entry.Id, isSynthetic: false, entry.Composition, formation);
            points.Add(new HullPoint(phase, entry, row, atoms));
        }

        AddCornerPoints(space, points);

        // Canonical order (by id; a synthetic reference after an entry of the same id) makes every tie-break of the
        // engine, and so every result, independent of the input order.
        _points = points
            .OrderBy(p => p.Phase.Id, StringComparer.Ordinal)
            .ThenBy(p => p.Phase.IsSynthetic)
            .ToArray();
        _hull = LowerHull.Build(
            _points.Select(p => p.Amounts).ToArray(),
            _points.Select(p => p.FormationEnergyEvPerAtom).ToArray());
        _vertexSet = [.. _hull.VertexPoints];

        if (space is ComponentSpace.OverEndMembers)
        {
            _endMemberCornerEvPerAtom = new double[space.Names.Count];
            foreach (int v in _hull.VertexPoints)
            {
                if (_points[v].IsPureComponent)
                {
                    _endMemberCornerEvPerAtom[Array.FindIndex(_points[v].Amounts, a => a != 0)] = _points[v].FormationEnergyEvPerAtom;
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
        StablePhases = _hull.VertexPoints.Select(v => _points[v].Phase).ToArray();
    }

    /// <summary>The components (element symbols, or end-member formulas) in hull order.</summary>
    public IReadOnlyList<string> Components => _space.Names;

    /// <summary>The components joined by '-', e.g. "Fe-O".</summary>
    public string SystemName => _space.SystemName;

    /// <summary>The end-members when the hull is over compound end-members; null over elements.</summary>
    public EndMemberBasis? EndMembers => (_space as ComponentSpace.OverEndMembers)?.Basis;

    /// <summary>The elemental references used for total energies, sorted by symbol.</summary>
    public IReadOnlyList<ElementReference> References { get; }

    /// <summary>Every entry's stability, in the order the entries were given.</summary>
    public IReadOnlyList<EntryStability> Entries => _entries.Value;

    /// <summary>The stable phases (hull vertices), sorted by id; synthetic references included and flagged.</summary>
    public IReadOnlyList<HullPhase> StablePhases { get; }

    /// <summary>The hull facets, each with its corner phases and chemical potentials.</summary>
    public IReadOnlyList<PhaseFacet> Facets => _facets.Value;

    /// <summary>Pairs of stable phases sharing a facet, without repeats, sorted by the first then the second id.</summary>
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
        BigFraction[] atoms = MapQuery(composition);
        HullPosition position = _hull.Locate(FractionsOf(atoms));
        return BuildDecomposition(composition, atoms, position);
    }

    /// <summary>The hull energy (formation energy of the hull, eV/atom) at any composition of the system.</summary>
    public double HullEnergyAt(Composition composition) => DecompositionAt(composition).HullEnergyEvPerAtom;

    /// <summary>How a phase of this composition and formation energy (eV/atom) would sit against the hull, without adding it.</summary>
    /// <exception cref="ThermoInputException">When the composition lies outside the system or the energy is not finite.</exception>
    public CandidateStability Assess(Composition composition, double formationEnergyEvPerAtom)
    {
        if (!double.IsFinite(formationEnergyEvPerAtom))
        {
            throw new ThermoInputException($"The formation energy of candidate {composition?.Formula} is not finite.");
        }

        Decomposition decomposition = DecompositionAt(composition!);
        double relative = formationEnergyEvPerAtom - decomposition.HullEnergyEvPerAtom;
        if (Math.Abs(relative) <= HullTolerances.EnergyEvPerAtom)
        {
            relative = 0.0;
        }

        return new CandidateStability(composition!, formationEnergyEvPerAtom, relative, decomposition);
    }

    /// <summary>The stability of the point at canonical index <paramref name="i"/>, which must be an entry.</summary>
    internal EntryStability ComputeEntry(int i)
    {
        HullPoint point = _points[i];
        PhaseEntry entry = point.Entry ?? throw new InvalidOperationException("A synthetic reference has no stability record.");
        HullPosition position = PositionOf(i);
        double above = _hull.EnergyAboveHull(i);
        if (above <= HullTolerances.EnergyEvPerAtom)
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

            fromEndMembers = point.FormationEnergyEvPerAtom - corners;
        }

        double? decompositionEnergy = above == 0.0 && !point.IsPureComponent ? DecompositionEnergy(i) : null;
        return new EntryStability(
            entry,
            point.RowIndex,
            SystemName,
            point.FormationEnergyEvPerAtom,
            fromEndMembers,
            point.Fractions,
            above,
            _vertexSet.Contains(i),
            BuildDecomposition(entry.Composition, point.ComponentAtoms, position),
            decompositionEnergy);
    }

    /// <summary>Canonical indices of the points that are entries, for callers that report only some of them.</summary>
    internal IEnumerable<(int PointIndex, int RowIndex)> EntryPoints() =>
        Enumerable.Range(0, _points.Length).Where(i => _points[i].Entry is not null).Select(i => (i, _points[i].RowIndex));

    /// <summary>
    /// Decomposition energy computed the slow way, by rebuilding the whole hull without the entry's reduced
    /// composition; a check on the fast path. Null where the fast path gives null.
    /// </summary>
    internal double? DecompositionEnergyByFullRebuild(string id)
    {
        int i = Array.FindIndex(_points, p => p.Entry is not null && string.Equals(p.Phase.Id, id, StringComparison.Ordinal));
        HullPoint point = _points[i];
        if (point.IsPureComponent || _hull.EnergyAboveHull(i) > HullTolerances.EnergyEvPerAtom)
        {
            return null;
        }

        int[] others = Enumerable.Range(0, _points.Length)
            .Where(j => !string.Equals(_points[j].CompositionKey, point.CompositionKey, StringComparison.Ordinal))
            .ToArray();
        double hullWithout = HullEnergyOfSubset(others, point.Fractions);
        return SnapDecompositionEnergy(point.FormationEnergyEvPerAtom - hullWithout);
    }

    private double DecompositionEnergy(int i)
    {
        HullPoint point = _points[i];
        if (_decompositionEnergyByKey.TryGetValue(point.CompositionKey, out double known))
        {
            return SnapDecompositionEnergy(point.FormationEnergyEvPerAtom - known);
        }

        // Removing a vertex v changes the hull only inside its star (the facets that contain v): elsewhere every old
        // facet still supports all remaining points. A new facet over x_v cannot reach a point strictly outside the
        // star either: near that point it would coincide with an old facet plane, which passes at or below e_v at x_v.
        // So the hull energy at x_v without v needs only the star's other corners, the points located in the star,
        // and (to anchor the engine, which needs a pure point per component) the pure corners; adding any of the
        // remaining points could not lower it. This keeps the rebuild local instead of rebuilding the whole hull.
        int vertex = _hull.VertexPoints.FirstOrDefault(
            v => string.Equals(_points[v].CompositionKey, point.CompositionKey, StringComparison.Ordinal), -1);
        double hullWithout;
        if (vertex < 0)
        {
            // No vertex has this composition: removing its points leaves the hull as it is.
            hullWithout = PositionOf(i).HullEnergyEvPerAtom;
        }
        else
        {
            IndexStars();
            var subset = new SortedSet<int>(_pureCorners!);
            foreach (int facet in _facetsOfVertex![vertex])
            {
                foreach (int corner in _hull.Facets[facet].VertexPoints)
                {
                    if (corner != vertex)
                    {
                        subset.Add(corner);
                    }
                }

                foreach (int j in _pointsInFacet![facet])
                {
                    if (!string.Equals(_points[j].CompositionKey, point.CompositionKey, StringComparison.Ordinal))
                    {
                        subset.Add(j);
                    }
                }
            }

            hullWithout = HullEnergyOfSubset(subset.ToArray(), point.Fractions);
        }

        _decompositionEnergyByKey[point.CompositionKey] = hullWithout;
        return SnapDecompositionEnergy(point.FormationEnergyEvPerAtom - hullWithout);
    }

    // An entry on the hull cannot lie above the hull without its composition; differences within the hull
    // tolerance are ties (an entry that only touches the hull), reported as exactly 0.
    private static double SnapDecompositionEnergy(double value) =>
        value >= -HullTolerances.EnergyEvPerAtom ? 0.0 : value;

    private double HullEnergyOfSubset(int[] subset, double[] fractions)
    {
        LowerHull reduced = LowerHull.Build(
            subset.Select(j => _points[j].Amounts).ToArray(),
            subset.Select(j => _points[j].FormationEnergyEvPerAtom).ToArray());
        return reduced.Locate(fractions).HullEnergyEvPerAtom;
    }

    /// <summary>Indexes, once, the facets around each vertex and the non-vertex points located in each facet.</summary>
    private void IndexStars()
    {
        if (_facetsOfVertex is not null)
        {
            return;
        }

        var facetsOfVertex = new List<int>[_points.Length];
        var pointsInFacet = new List<int>[_hull.Facets.Count];
        for (int f = 0; f < _hull.Facets.Count; f++)
        {
            pointsInFacet[f] = [];
            foreach (int v in _hull.Facets[f].VertexPoints)
            {
                (facetsOfVertex[v] ??= []).Add(f);
            }
        }

        for (int j = 0; j < _points.Length; j++)
        {
            if (!_vertexSet.Contains(j))
            {
                pointsInFacet[PositionOf(j).FacetIndex].Add(j);
            }
        }

        _pureCorners = _hull.VertexPoints.Where(v => _points[v].IsPureComponent).ToArray();
        _pointsInFacet = pointsInFacet;
        _facetsOfVertex = facetsOfVertex;
    }

    private HullPosition PositionOf(int i)
    {
        _positions ??= new HullPosition?[_points.Length];
        return _positions[i] ??= _hull.LocatePoint(i);
    }

    private BigFraction[] MapQuery(Composition composition)
    {
        ArgumentNullException.ThrowIfNull(composition);
        if (!_space.TryMap(composition, out BigFraction[] atoms, out string failure))
        {
            throw new ThermoInputException($"{composition.Formula} {failure}");
        }

        return atoms;
    }

    private static double[] FractionsOf(BigFraction[] atoms)
    {
        BigFraction total = BigFraction.Zero;
        foreach (BigFraction a in atoms)
        {
            total += a;
        }

        return atoms.Select(a => (a / total).ToDouble()).ToArray();
    }

    /// <summary>
    /// Products and coefficients of a decomposition. The engine names the hull phases and their weights in floating
    /// point; the coefficients are then solved exactly from the compositions (the phases of one facet are linearly
    /// independent, so the balance is unique). Floating-point weights are the fallback should the exact balance fail.
    /// </summary>
    private Decomposition BuildDecomposition(Composition composition, BigFraction[] targetAtoms, HullPosition position)
    {
        BigFraction targetTotal = BigFraction.Zero;
        foreach (BigFraction a in targetAtoms)
        {
            targetTotal += a;
        }

        IReadOnlyList<int> vertices = position.VertexPoints;
        var products = new List<(int Point, double AtomFraction, double FormulaUnits, Rational? Exact)>(vertices.Count);

        // Phases containing a component the target lacks can only carry weight 0 exactly.
        int[] candidates = vertices.Where(v => WithinSupport(_points[v].ComponentAtoms, targetAtoms)).ToArray();
        BigFraction[]? exact = ExactLinearAlgebra.Solve(candidates.Select(v => _points[v].ComponentAtoms).ToArray(), targetAtoms);
        if (exact is not null && exact.All(c => c.Sign >= 0))
        {
            for (int k = 0; k < candidates.Length; k++)
            {
                if (exact[k].IsZero)
                {
                    continue;
                }

                HullPoint product = _points[candidates[k]];
                double fraction = (exact[k] * product.AtomsPerFormulaUnit / targetTotal).ToDouble();
                Rational? coefficient = exact[k].TryToRational(out Rational r) ? r : null;
                products.Add((candidates[k], fraction, exact[k].ToDouble(), coefficient));
            }
        }
        else
        {
            double totalAtoms = targetTotal.ToDouble();
            for (int k = 0; k < vertices.Count; k++)
            {
                HullPoint product = _points[vertices[k]];
                double formulaUnits = position.AtomFractions[k] * totalAtoms / product.AtomsPerFormulaUnit.ToDouble();
                products.Add((vertices[k], position.AtomFractions[k], formulaUnits, null));
            }
        }

        DecompositionProduct[] ordered = products
            .OrderBy(p => p.Point)
            .Select(p => new DecompositionProduct(_points[p.Point].Phase, p.AtomFraction, p.FormulaUnits, p.Exact))
            .ToArray();
        return new Decomposition(composition, position.HullEnergyEvPerAtom, ordered);
    }

    private static bool WithinSupport(BigFraction[] candidate, BigFraction[] target)
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

    private static void AddCornerPoints(ComponentSpace space, List<HullPoint> points)
    {
        for (int k = 0; k < space.Names.Count; k++)
        {
            if (points.Any(p => p.IsPureComponent && p.Amounts[k] != 0))
            {
                continue;
            }

            string name = space.Names[k];
            if (space is ComponentSpace.OverEndMembers)
            {
                throw new ThermoInputException(
                    $"End-member {name} has no entry: a hull over end-members needs at least one entry of each end-member's reduced composition.");
            }

            // An element without entries sits at its reference state: formation energy 0 by definition.
            Composition single = Composition.Parse(name);
            var atoms = new BigFraction[space.Names.Count];
            atoms[k] = BigFraction.One;
            points.Add(new HullPoint(new HullPhase(name, isSynthetic: true, single, 0.0), null, -1, atoms));
        }
    }

    private IReadOnlyList<PhaseFacet> BuildFacets() =>
        _hull.Facets
            .Select(f => new PhaseFacet(
                f.VertexPoints.Order().Select(v => _points[v].Phase).ToArray(),
                Components,
                f.ChemicalPotentialsEvPerAtom.ToArray()))
            .ToArray();

    private IReadOnlyList<TieLine> BuildTieLines()
    {
        var pairs = new SortedSet<(int, int)>();
        foreach (HullFacet facet in _hull.Facets)
        {
            int[] corners = facet.VertexPoints.Order().ToArray();
            for (int a = 0; a < corners.Length; a++)
            {
                for (int b = a + 1; b < corners.Length; b++)
                {
                    pairs.Add((corners[a], corners[b]));
                }
            }
        }

        // Canonical indices follow the id order, so sorting the index pairs sorts the tie-lines by id.
        return pairs.Select(p => new TieLine(_points[p.Item1].Phase, _points[p.Item2].Phase)).ToArray();
    }
}
