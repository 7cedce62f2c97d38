using Hull.Core.Geometry;
using Hull.Core.Thermo;

namespace Hull.Core.Windows;

/// <summary>
/// One compound's window as a polytope over the potentials of its system's elements: Σ x_ci Δμ_i = E_c per atom of
/// the compound (or one such equality per coexisting phase for a compound inside a face of the hull), Σ x_ji Δμ_i ≤
/// E_j for every other stable phase j, Δμ_i ≤ 0, with the implied lower bounds Δμ_i ≥ E_c / x_ci as the starting
/// box. Only hull vertices take part: a phase above the hull is a mixture of vertices, so its limit is implied.
/// </summary>
internal sealed class WindowSetup
{
    private WindowSetup(
        EntryStability compound, string[] elements, WindowKind kind, double? lowered, HullPhase[] coexisting,
        HullPhase[] constraints, HalfSpace[] equalities, double[] lower, int projectionOmits)
    {
        Compound = compound;
        Elements = elements;
        Kind = kind;
        LoweredByEvPerAtom = lowered;
        Coexisting = coexisting;
        Constraints = constraints;
        Equalities = equalities;
        Lower = lower;
        ProjectionOmits = projectionOmits;
    }

    public EntryStability Compound { get; }

    public string[] Elements { get; }

    public WindowKind Kind { get; }

    public double? LoweredByEvPerAtom { get; }

    public HullPhase[] Coexisting { get; }

    /// <summary>Competing phases; inequality labels index this array.</summary>
    public HullPhase[] Constraints { get; }

    public HalfSpace[] Equalities { get; }

    public double[] Lower { get; }

    public int ProjectionOmits { get; }

    public static WindowSetup Prepare(SystemHull hull, string entryId, WindowOptions options)
    {
        if (hull.EndMembers is not null)
        {
            throw new WindowInputException($"Windows need a hull over elements; {hull.SystemName} is over compound end-members.", WindowInputSubject.Compound);
        }

        // The window's constraints are formation energies against the elemental references (Δμ = 0 at each).
        if (hull.Axis.Quantity != HullAxis.FormationEnergy.Quantity)
        {
            throw new WindowInputException($"Windows need a formation-energy hull; {hull.SystemName} hulls {hull.Axis}.", WindowInputSubject.Compound);
        }

        EntryStability compound;
        try
        {
            compound = hull.GetEntry(entryId);
        }
        catch (KeyNotFoundException)
        {
            throw new WindowInputException($"No entry '{entryId}' in the hull of {hull.SystemName}.", WindowInputSubject.Compound);
        }

        string[] elements = hull.Components.ToArray();
        if (compound.Composition.Elements.Count != elements.Length)
        {
            throw new WindowInputException(
                $"Entry '{entryId}' ({compound.Composition.Formula}) does not contain every element of {hull.SystemName}; " +
                $"its window lives in the hull of its own elements ({compound.Composition.ChemicalSystem}).",
                WindowInputSubject.Compound);
        }

        int omit = ProjectionChoice(compound, elements, options.ProjectionOmits);
        double[] x = Fractions(compound.Composition, elements);
        bool lowerable = options.AboveHullToleranceEvPerAtom is { } tolerance && !compound.IsHullVertex
            && compound.EnergyAboveHullEvPerAtom <= tolerance;
        WindowKind kind;
        double? lowered = null;
        HullPhase[] coexisting = [];
        var equalities = new List<HalfSpace>();
        double energy;
        if (compound.IsHullVertex)
        {
            kind = WindowKind.Full;
            energy = compound.AxisEnergyEvPerAtom;
            equalities.Add(new HalfSpace(x, energy, -1));
        }
        else if (lowerable)
        {
            kind = WindowKind.Lowered;
            lowered = options.LoweringEvPerAtom;
            energy = compound.Decomposition.HullEnergyEvPerAtom - options.LoweringEvPerAtom;
            equalities.Add(new HalfSpace(x, energy, -1));
        }
        else if (compound.IsOnHull)
        {
            coexisting = compound.Decomposition.Products.Select(p => p.Phase).ToArray();
            kind = coexisting.Length == 1 ? WindowKind.Full : WindowKind.LowerDimensional;
            energy = compound.Decomposition.HullEnergyEvPerAtom;
            foreach (HullPhase p in coexisting) equalities.Add(new HalfSpace(Fractions(p.Composition, elements), p.AxisEnergyEvPerAtom, -1));
            if (coexisting.Length == 1) coexisting = [];
        }
        else
        {
            return new WindowSetup(compound, elements, WindowKind.AboveHull, null, [], [], [], [], omit);
        }

        // The compound's own vertex (its composition, or the coexisting phases) is the equality, not a limit.
        var excluded = new HashSet<string>(coexisting.Select(p => p.Id), StringComparer.Ordinal);
        if (kind != WindowKind.Lowered && !compound.IsHullVertex && compound.Decomposition.Products.Count == 1)
        {
            excluded.Add(compound.Decomposition.Products[0].Phase.Id);
        }

        excluded.Add(compound.Id);
        HullPhase[] constraints = hull.StablePhases
            .Where(p => !excluded.Contains(p.Id) && !IsBareReference(p))
            .ToArray();
        var lower = new double[elements.Length];
        for (int i = 0; i < elements.Length; i++) lower[i] = Math.Min(energy / x[i], 0);
        return new WindowSetup(compound, elements, kind, lowered, coexisting, constraints, equalities.ToArray(), lower, omit);
    }

    /// <summary>A single-element phase at or above formation energy 0 adds nothing to the bound Δμ ≤ 0.</summary>
    public static bool IsBareReference(HullPhase p) =>
        p.Composition.IsSingleElement && p.AxisEnergyEvPerAtom >= -HullTolerances.EnergyEvPerAtom;

    public static double[] Fractions(Chemistry.Composition composition, IReadOnlyList<string> elements) =>
        elements.Select(composition.AtomicFraction).ToArray();

    public PolytopeDefinition Definition(IReadOnlyList<HalfSpace> extraEqualities, IReadOnlyList<int> eliminateFirst)
    {
        var inequalities = Constraints
            .Select((p, k) => new HalfSpace(Fractions(p.Composition, Elements), p.AxisEnergyEvPerAtom, k))
            .ToArray();
        var order = eliminateFirst.Append(ProjectionOmits).Distinct().ToArray();
        return new PolytopeDefinition(Lower, new double[Elements.Length], Equalities.Concat(extraEqualities).ToArray(), inequalities, order);
    }

    public StabilityWindow NoWindow() =>
        new(Compound, Elements, WindowKind.AboveHull, null, [], [], null, []);

    public StabilityWindow Describe(PolytopeVertices polytope)
    {
        if (polytope.IsEmpty) return new StabilityWindow(Compound, Elements, Kind, LoweredByEvPerAtom, Coexisting, [], null, []);
        var vertices = polytope.Vertices
            .OrderBy(v => v.Coordinates, LexicographicDescending.Instance)
            .ToArray();
        WindowVertex[] described = vertices.Select(v => new WindowVertex(
                v.Coordinates.ToArray(),
                v.TightLabels.Select(k => Constraints[k]).OrderBy(p => p.Id, StringComparer.Ordinal).ToArray(),
                v.TightUpperBounds.Select(i => Elements[i]).ToArray()))
            .ToArray();
        return new StabilityWindow(
            Compound, Elements, Kind, LoweredByEvPerAtom, Coexisting, described,
            () => WindowMeasures.Size(vertices, polytope.FreeCoordinates, Elements), WindowMeasures.Extremes(described, Elements));
    }

    private static int ProjectionChoice(EntryStability compound, string[] elements, string? omit)
    {
        if (omit is not null)
        {
            int at = Array.IndexOf(elements, omit);
            if (at < 0)
            {
                throw new WindowInputException(
                    $"The projection cannot leave out {omit}: it is not an element of {string.Join('-', elements)}.", WindowInputSubject.Option, omit);
            }

            return at;
        }

        // The element with most atoms (the last such in element order): for oxides that is oxygen, so the
        // projection is on the cation potentials.
        int best = 0;
        for (int i = 1; i < elements.Length; i++)
        {
            if (compound.Composition.AmountOf(elements[i]) >= compound.Composition.AmountOf(elements[best])) best = i;
        }

        return best;
    }
}
